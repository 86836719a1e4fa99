// Reads what an uploaded file is from its bytes alone: format by magic number,
// pixel size from the header (before any decoding), the EXIF orientation, and
// whether the file is whole. Pure: no I/O, so it runs on the request path and in
// unit tests. Refusals carry a sentence fit to show the writer.
import { PHOTO_ACCEPTED_TEXT, PHOTO_FORMATS, PHOTO_MAX_MEGAPIXELS, type PhotoFormat, type PhotoMime } from '#shared/types/photos'

/** 415 for a kind of file we do not take, 422 for one that is damaged or too large to process. */
export class PhotoRefusal extends Error {
  constructor(message: string, readonly status: 415 | 422) {
    super(message)
    this.name = 'PhotoRefusal'
  }
}

export interface InspectedPhoto {
  format: PhotoFormat
  mime: PhotoMime
  /** As stored in the file, before orientation. */
  width: number
  height: number
  /** EXIF orientation 1-8 (1 when absent or unreadable). */
  orientation: number
}

function refuse(message: string): never {
  throw new PhotoRefusal(message, 422)
}

/** A refusal of the file's kind says what is accepted instead. */
function refuseKind(message: string): never {
  throw new PhotoRefusal(`${message} ${PHOTO_ACCEPTED_TEXT}`, 415)
}

function ascii(bytes: Uint8Array, start: number, length: number): string {
  return String.fromCharCode(...bytes.subarray(start, start + length))
}

function startsWith(bytes: Uint8Array, signature: number[], at = 0): boolean {
  return signature.every((b, i) => bytes[at + i] === b)
}

const JPEG_SOI = [0xFF, 0xD8, 0xFF]
const PNG_SIGNATURE = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]
// ISO base media brands of HEIF/HEIC and AVIF files (ftyp box at offset 4).
const HEIF_BRANDS = new Set(['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'hevm', 'hevs', 'mif1', 'msf1'])

/** Format from magic numbers; anything else is refused with what it seems to be. */
export function detectPhotoFormat(bytes: Uint8Array): PhotoFormat {
  if (bytes.length === 0) refuse('The file is empty (0 bytes): choose the photo again and upload it.')
  if (startsWith(bytes, JPEG_SOI)) return 'jpeg'
  if (startsWith(bytes, PNG_SIGNATURE)) return 'png'
  if (ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 4) === 'WEBP') return 'webp'

  if (ascii(bytes, 4, 4) === 'ftyp') {
    const brand = ascii(bytes, 8, 4)
    if (HEIF_BRANDS.has(brand)) refuseKind('HEIC/HEIF photos are not accepted: export the photo as JPEG and upload that.')
    if (brand === 'avif' || brand === 'avis') refuseKind('AVIF images are not accepted: export the photo as JPEG and upload that.')
  }
  const head = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, 4096)).replace(/^\uFEFF/, '').trimStart().toLowerCase()
  if (head.startsWith('<') && /<svg[\s>]/.test(head)) refuseKind('SVG drawings are not accepted (they can carry scripts).')
  if (ascii(bytes, 0, 4) === 'GIF8') refuseKind('GIF images are not accepted.')
  if (startsWith(bytes, [0x49, 0x49, 0x2A, 0x00]) || startsWith(bytes, [0x4D, 0x4D, 0x00, 0x2A])) refuseKind('TIFF and camera raw files are not accepted: export the photo as JPEG.')
  if (ascii(bytes, 0, 5) === '%PDF-') refuseKind('PDF documents are not accepted.')
  if (ascii(bytes, 0, 2) === 'BM') refuseKind('BMP images are not accepted.')
  if (looksLikeText(bytes)) refuseKind('This is a text file, not a photo (whatever its name says).')
  return refuseKind('This file is not a JPEG, PNG or WebP image (its contents were checked, not its name).')
}

function looksLikeText(bytes: Uint8Array): boolean {
  const sample = bytes.subarray(0, 1024)
  let printable = 0
  for (const b of sample) if (b === 9 || b === 10 || b === 13 || (b >= 32 && b < 127) || b >= 128) printable++
  return !sample.includes(0) && printable === sample.length
}

// ---------- EXIF orientation (TIFF structure, as in JPEG APP1, PNG eXIf, WebP EXIF) ----------

/** Orientation tag 0x0112 of IFD0; 1 when absent or the structure is broken. */
export function exifOrientation(tiff: Uint8Array): number {
  let data = tiff
  if (ascii(data, 0, 6) === 'Exif\0\0') data = data.subarray(6)
  if (data.length < 8) return 1
  const little = ascii(data, 0, 2) === 'II'
  if (!little && ascii(data, 0, 2) !== 'MM') return 1
  const view = new DataView(data.buffer, data.byteOffset, data.byteLength)
  if (view.getUint16(2, little) !== 42) return 1
  const ifd = view.getUint32(4, little)
  if (ifd + 2 > data.length) return 1
  const count = view.getUint16(ifd, little)
  for (let i = 0; i < count; i++) {
    const entry = ifd + 2 + i * 12
    if (entry + 12 > data.length) return 1
    if (view.getUint16(entry, little) !== 0x0112) continue
    const value = view.getUint16(entry + 8, little)
    return value >= 1 && value <= 8 ? value : 1
  }
  return 1
}

// ---------- JPEG ----------

function truncated(format: string): never {
  return refuse(`The ${format} file is incomplete: it ends before the end of the image. Upload the whole file again.`)
}

/** Walks every segment to the end-of-image marker; a file cut short never reaches it. */
function inspectJpeg(bytes: Uint8Array): Omit<InspectedPhoto, 'format' | 'mime'> {
  let width = 0
  let height = 0
  let orientation = 1
  let pos = 2
  for (;;) {
    if (pos >= bytes.length) return truncated('JPEG')
    if (bytes[pos] !== 0xFF) refuse('The JPEG file is damaged (a segment does not start where it should).')
    while (bytes[pos] === 0xFF) pos++ // fill bytes
    if (pos >= bytes.length) return truncated('JPEG')
    const marker = bytes[pos++]!
    if (marker === 0xD9) break // end of image
    if (marker === 0x01 || (marker >= 0xD0 && marker <= 0xD7)) continue // no length
    if (pos + 2 > bytes.length) return truncated('JPEG')
    const length = (bytes[pos]! << 8) | bytes[pos + 1]!
    if (length < 2) refuse('The JPEG file is damaged (a segment has an impossible length).')
    const end = pos + length
    if (end > bytes.length) return truncated('JPEG')
    const isFrame = marker >= 0xC0 && marker <= 0xCF && marker !== 0xC4 && marker !== 0xC8 && marker !== 0xCC
    if (isFrame && !width) {
      if (length < 8) refuse('The JPEG file is damaged (its frame header is too short).')
      height = (bytes[pos + 3]! << 8) | bytes[pos + 4]!
      width = (bytes[pos + 5]! << 8) | bytes[pos + 6]!
    }
    if (marker === 0xE1 && orientation === 1 && ascii(bytes, pos + 2, 6) === 'Exif\0\0') {
      orientation = exifOrientation(bytes.subarray(pos + 8, end))
    }
    pos = end
    if (marker === 0xDA) {
      if (!width) refuse('The JPEG file is damaged (image data before its size).')
      pos = skipEntropyData(bytes, pos)
    }
  }
  if (!width || !height) refuse('The JPEG file does not say how large the image is.')
  return { width, height, orientation }
}

/** After a scan header: the next real marker (0xFF not followed by stuffing 00 or a restart marker). */
function skipEntropyData(bytes: Uint8Array, from: number): number {
  let pos = from
  for (;;) {
    const ff = bytes.indexOf(0xFF, pos)
    if (ff < 0 || ff + 1 >= bytes.length) return bytes.length
    const next = bytes[ff + 1]!
    if (next === 0x00 || next === 0xFF || (next >= 0xD0 && next <= 0xD7)) {
      pos = ff + (next === 0xFF ? 1 : 2)
      continue
    }
    return ff
  }
}

// ---------- PNG ----------

function inspectPng(bytes: Uint8Array): Omit<InspectedPhoto, 'format' | 'mime'> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  if (bytes.length < 33 || ascii(bytes, 12, 4) !== 'IHDR') return truncated('PNG')
  const width = view.getUint32(16)
  const height = view.getUint32(20)
  let orientation = 1
  let pos = 8
  for (;;) {
    if (pos + 12 > bytes.length) return truncated('PNG')
    const length = view.getUint32(pos)
    const type = ascii(bytes, pos + 4, 4)
    const end = pos + 12 + length
    if (end > bytes.length) return truncated('PNG')
    if (type === 'eXIf') orientation = exifOrientation(bytes.subarray(pos + 8, pos + 8 + length))
    if (type === 'acTL') refuse('Animated PNG images are not accepted.')
    if (type === 'IEND') break
    pos = end
  }
  if (!width || !height) refuse('The PNG file does not say how large the image is.')
  return { width, height, orientation }
}

// ---------- WebP ----------

function inspectWebp(bytes: Uint8Array): Omit<InspectedPhoto, 'format' | 'mime'> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  if (bytes.length < 12) return truncated('WebP')
  const riffEnd = 8 + view.getUint32(4, true)
  if (riffEnd > bytes.length) return truncated('WebP')
  let width = 0
  let height = 0
  let orientation = 1
  let pos = 12
  while (pos + 8 <= riffEnd) {
    const type = ascii(bytes, pos, 4)
    const size = view.getUint32(pos + 4, true)
    const data = pos + 8
    if (data + size > riffEnd) return truncated('WebP')
    if (type === 'VP8X' && size >= 10) {
      if (bytes[data]! & 0x02) refuse('Animated WebP images are not accepted.')
      width = 1 + (bytes[data + 4]! | (bytes[data + 5]! << 8) | (bytes[data + 6]! << 16))
      height = 1 + (bytes[data + 7]! | (bytes[data + 8]! << 8) | (bytes[data + 9]! << 16))
    }
    else if (type === 'VP8 ' && size >= 10 && !width) {
      if (!startsWith(bytes, [0x9D, 0x01, 0x2A], data + 3)) refuse('The WebP file is damaged (its frame header is missing).')
      width = view.getUint16(data + 6, true) & 0x3FFF
      height = view.getUint16(data + 8, true) & 0x3FFF
    }
    else if (type === 'VP8L' && size >= 5 && !width) {
      if (bytes[data] !== 0x2F) refuse('The WebP file is damaged (its lossless header is missing).')
      const bits = view.getUint32(data + 1, true)
      width = (bits & 0x3FFF) + 1
      height = ((bits >>> 14) & 0x3FFF) + 1
    }
    else if (type === 'EXIF') {
      orientation = exifOrientation(bytes.subarray(data, data + size))
    }
    else if (type === 'ANIM') {
      refuse('Animated WebP images are not accepted.')
    }
    pos = data + size + (size & 1) // chunks are padded to an even size
  }
  if (!width || !height) return truncated('WebP')
  return { width, height, orientation }
}

/**
 * Everything the upload needs to know before storing: throws PhotoRefusal for an
 * empty, unknown, incomplete or oversized file (over PHOTO_MAX_MEGAPIXELS).
 */
export function inspectPhotoBytes(bytes: Uint8Array): InspectedPhoto {
  const format = detectPhotoFormat(bytes)
  const found = format === 'jpeg' ? inspectJpeg(bytes) : format === 'png' ? inspectPng(bytes) : inspectWebp(bytes)
  const megapixels = (found.width * found.height) / 1e6
  if (megapixels > PHOTO_MAX_MEGAPIXELS) {
    refuse(`This image is ${found.width.toLocaleString('en-US')} x ${found.height.toLocaleString('en-US')} pixels (${Math.round(megapixels).toLocaleString('en-US')} megapixels); at most ${PHOTO_MAX_MEGAPIXELS} megapixels can be processed. Scale it down and upload again.`)
  }
  const mime = PHOTO_FORMATS.find(f => f.id === format)!.mime
  return { format, mime, ...found }
}
