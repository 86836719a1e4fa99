import { describe, expect, it } from 'vitest'
import { exifOrientation, inspectPhotoBytes, PhotoRefusal } from '../../../server/services/photos/bytes'
import { tiffBytes, withExif } from '../../support/exif'
import { makeJpeg, makePng, makeWebp } from '../../support/photos'

// Magic numbers and header layouts: JPEG (ITU-T T.81 annex B: SOI FF D8, SOFn
// frame header, EOI FF D9), PNG (W3C PNG 3rd ed.: signature 89 50 4E 47 0D 0A
// 1A 0A, IHDR first, IEND last), WebP (RFC 9649: RIFF....WEBP, VP8/VP8L/VP8X),
// HEIF (ISO/IEC 23008-12 brands in the ftyp box), EXIF orientation (CIPA DC-008 tag 0x0112).

function refusal(bytes: Uint8Array): PhotoRefusal {
  try {
    inspectPhotoBytes(bytes)
  }
  catch (error) {
    if (error instanceof PhotoRefusal) return error
    throw error
  }
  throw new Error('expected a refusal')
}

describe('format and size from the bytes', () => {
  it('reads a JPEG: size from the frame header, walking to the end-of-image marker', async () => {
    const found = inspectPhotoBytes(await makeJpeg(123, 45))
    expect(found).toEqual({ format: 'jpeg', mime: 'image/jpeg', width: 123, height: 45, orientation: 1 })
  })

  it('reads a PNG from IHDR', async () => {
    expect(inspectPhotoBytes(await makePng(64, 20))).toMatchObject({ format: 'png', width: 64, height: 20 })
  })

  it.each([false, true])('reads a WebP (lossless: %s) from its VP8 / VP8L / VP8X chunk', async (lossless) => {
    expect(inspectPhotoBytes(await makeWebp(70, 31, undefined, { lossless }))).toMatchObject({ format: 'webp', mime: 'image/webp', width: 70, height: 31 })
  })

  it('reads the EXIF orientation of a JPEG', async () => {
    const jpeg = withExif(await makeJpeg(40, 20), { orientation: 6, gps: { latitude: 45.5, longitude: -122.25 } })
    expect(inspectPhotoBytes(jpeg)).toMatchObject({ width: 40, height: 20, orientation: 6 })
  })

  it('reads orientation in either byte order, and 1 when the tag is absent or the structure is broken', () => {
    expect(exifOrientation(tiffBytes({ orientation: 8 }))).toBe(8)
    const little = Uint8Array.from([0x49, 0x49, 42, 0, 8, 0, 0, 0, 1, 0, 0x12, 0x01, 3, 0, 1, 0, 0, 0, 3, 0, 0, 0, 0, 0, 0, 0])
    expect(exifOrientation(little)).toBe(3)
    expect(exifOrientation(tiffBytes({}))).toBe(1)
    expect(exifOrientation(Uint8Array.from([0x4D, 0x4D, 0, 42, 0, 0, 0xFF, 0xFF]))).toBe(1)
  })

  it('does not trust the name: a JPEG is a JPEG whatever the browser says', async () => {
    // inspectPhotoBytes sees only bytes; no name or type is passed at all.
    expect(inspectPhotoBytes(await makeJpeg(8, 8)).mime).toBe('image/jpeg')
  })
})

describe('refusals, each with a message that says what is wrong', () => {
  it('zero bytes', () => {
    const r = refusal(new Uint8Array())
    expect(r.message).toMatch(/empty/)
    expect(r.status).toBe(422)
  })

  it('a JPEG cut short inside its image data', async () => {
    const jpeg = await makeJpeg(200, 150)
    const r = refusal(jpeg.subarray(0, Math.floor(jpeg.length * 0.6)))
    expect(r.message).toMatch(/JPEG file is incomplete/)
  })

  it('a JPEG cut short in its headers', async () => {
    const jpeg = await makeJpeg(200, 150)
    expect(refusal(jpeg.subarray(0, 30)).message).toMatch(/incomplete/)
  })

  it('a PNG cut short, and a WebP cut short', async () => {
    const png = await makePng(50, 50)
    expect(refusal(png.subarray(0, png.length - 20)).message).toMatch(/PNG file is incomplete/)
    const webp = await makeWebp(50, 50)
    expect(refusal(webp.subarray(0, webp.length - 10)).message).toMatch(/WebP file is incomplete/)
  })

  it('a PNG claiming 50,000 x 50,000 pixels, before any decoding', async () => {
    const png = Buffer.from(await makePng(4, 4))
    png.writeUInt32BE(50_000, 16)
    png.writeUInt32BE(50_000, 20) // the CRC no longer matches, and it does not matter: nothing decodes
    const r = refusal(png)
    expect(r.message).toMatch(/50,000 x 50,000 pixels \(2,500 megapixels\).*at most 100 megapixels/)
    expect(r.status).toBe(422)
  })

  it('a renamed text file', () => {
    const r = refusal(Buffer.from('Baseline pulls were made on Tuesday.\nrpm,torque\n3000,410\n'))
    expect(r.message).toMatch(/text file/)
    expect(r.message).toMatch(/Accepted: JPEG, PNG and WebP/)
    expect(r.status).toBe(415)
  })

  it('an SVG with a script', () => {
    const svg = '<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>'
    const r = refusal(Buffer.from(svg))
    expect(r.message).toMatch(/SVG drawings are not accepted/)
    expect(r.message).toMatch(/Accepted: JPEG, PNG and WebP/)
  })

  it.each(['heic', 'mif1', 'heix'])('a HEIF file (brand %s): export as JPEG', (brand) => {
    const heic = Buffer.concat([Buffer.from([0, 0, 0, 24]), Buffer.from(`ftyp${brand}`), Buffer.alloc(16)])
    expect(refusal(heic).message).toMatch(/HEIC\/HEIF photos are not accepted: export the photo as JPEG/)
  })

  it('GIF and PDF are named', () => {
    expect(refusal(Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1')).message).toMatch(/GIF images are not accepted/)
    expect(refusal(Buffer.from('%PDF-1.7\n', 'latin1')).message).toMatch(/PDF documents are not accepted/)
  })

  it('an animated PNG (acTL chunk) and an animated WebP (VP8X animation flag)', async () => {
    const png = Buffer.from(await makePng(4, 4))
    const acTL = Buffer.from([0, 0, 0, 8, ...Buffer.from('acTL'), 0, 0, 0, 2, 0, 0, 0, 0, 0, 0, 0, 0]) // CRC not checked here
    const animatedPng = Buffer.concat([png.subarray(0, 33), acTL, png.subarray(33)])
    expect(refusal(animatedPng).message).toMatch(/Animated PNG images are not accepted/)
    const vp8x = Buffer.concat([Buffer.from('VP8X'), Buffer.from([10, 0, 0, 0, 0x02, 0, 0, 0, 3, 0, 0, 3, 0, 0])])
    const webp = Buffer.concat([Buffer.from('RIFF'), Buffer.from([vp8x.length + 4, 0, 0, 0]), Buffer.from('WEBP'), vp8x])
    expect(refusal(webp).message).toMatch(/Animated WebP images are not accepted/)
  })

  it('unknown binary', () => {
    expect(refusal(Uint8Array.from([0, 1, 2, 3, 250, 251, 0, 0])).message).toMatch(/not a JPEG, PNG or WebP image/)
  })
})
