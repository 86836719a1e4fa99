// A small byte writer for EXIF test fixtures: a TIFF structure with IFD0
// (Orientation, and a pointer to a GPS IFD) wrapped as a JPEG APP1 segment.
// Layout per the EXIF 2.32 specification (CIPA DC-008), section 4.6.

export interface ExifFixture {
  orientation?: number
  /** Degrees; written as degrees/minutes/seconds rationals with N/S and E/W refs. */
  gps?: { latitude: number, longitude: number }
}

const SHORT = 3
const LONG = 4
const ASCII = 2
const RATIONAL = 5

interface Entry { tag: number, type: number, count: number, value: number[] | string }

function dms(value: number): number[] {
  const abs = Math.abs(value)
  const deg = Math.floor(abs)
  const min = Math.floor((abs - deg) * 60)
  const sec = Math.round(((abs - deg) * 60 - min) * 60 * 100)
  return [deg, 1, min, 1, sec, 100]
}

/** Big-endian ("MM") TIFF bytes. */
export function tiffBytes(fixture: ExifFixture): Uint8Array {
  const ifd0: Entry[] = []
  if (fixture.orientation) ifd0.push({ tag: 0x0112, type: SHORT, count: 1, value: [fixture.orientation] })
  const gps: Entry[] = fixture.gps
    ? [
        { tag: 0x0000, type: 1, count: 4, value: [2, 3, 0, 0] }, // GPSVersionID 2.3.0.0 (BYTE)
        { tag: 0x0001, type: ASCII, count: 2, value: fixture.gps.latitude >= 0 ? 'N' : 'S' },
        { tag: 0x0002, type: RATIONAL, count: 3, value: dms(fixture.gps.latitude) },
        { tag: 0x0003, type: ASCII, count: 2, value: fixture.gps.longitude >= 0 ? 'E' : 'W' },
        { tag: 0x0004, type: RATIONAL, count: 3, value: dms(fixture.gps.longitude) },
      ]
    : []
  if (gps.length) ifd0.push({ tag: 0x8825, type: LONG, count: 1, value: [0] }) // patched below

  const out: number[] = [0x4D, 0x4D, 0x00, 0x2A, 0, 0, 0, 8]
  const u16 = (n: number) => out.push((n >> 8) & 0xFF, n & 0xFF)
  const u32 = (n: number) => out.push((n >>> 24) & 0xFF, (n >>> 16) & 0xFF, (n >>> 8) & 0xFF, n & 0xFF)
  const setU32 = (at: number, n: number) => { out[at] = (n >>> 24) & 0xFF; out[at + 1] = (n >>> 16) & 0xFF; out[at + 2] = (n >>> 8) & 0xFF; out[at + 3] = n & 0xFF }

  /** Writes an IFD at the current end; values over 4 bytes go after it. Returns where each entry's value field is. */
  function writeIfd(entries: Entry[]): number[] {
    const start = out.length
    u16(entries.length)
    const valueFields: number[] = []
    const extraStart = start + 2 + entries.length * 12 + 4
    const extra: number[] = []
    for (const e of entries) {
      u16(e.tag)
      u16(e.type)
      u32(e.count)
      valueFields.push(out.length)
      const bytes: number[] = []
      if (typeof e.value === 'string') bytes.push(...[...e.value].map(c => c.charCodeAt(0)), 0)
      else if (e.type === SHORT) for (const v of e.value) bytes.push((v >> 8) & 0xFF, v & 0xFF)
      else if (e.type === LONG || e.type === RATIONAL) for (const v of e.value) bytes.push((v >>> 24) & 0xFF, (v >>> 16) & 0xFF, (v >>> 8) & 0xFF, v & 0xFF)
      else bytes.push(...e.value)
      if (bytes.length <= 4) {
        while (bytes.length < 4) bytes.push(0)
        out.push(...bytes)
      }
      else {
        u32(extraStart + extra.length)
        extra.push(...bytes)
        if (extra.length % 2) extra.push(0)
      }
    }
    u32(0) // no next IFD
    out.push(...extra)
    return valueFields
  }

  const fields = writeIfd(ifd0)
  if (gps.length) {
    const gpsOffset = out.length
    writeIfd(gps)
    setU32(fields[ifd0.length - 1]!, gpsOffset)
  }
  return Uint8Array.from(out)
}

/** The APP1 segment: FF E1, length, "Exif\0\0", TIFF. */
export function exifSegment(fixture: ExifFixture): Uint8Array {
  const tiff = tiffBytes(fixture)
  const length = 2 + 6 + tiff.length
  return Uint8Array.from([0xFF, 0xE1, (length >> 8) & 0xFF, length & 0xFF, ...Buffer.from('Exif\0\0', 'latin1'), ...tiff])
}

/** The JPEG with an EXIF segment inserted right after its start-of-image marker. */
export function withExif(jpeg: Uint8Array, fixture: ExifFixture): Uint8Array {
  return Buffer.concat([jpeg.subarray(0, 2), exifSegment(fixture), jpeg.subarray(2)])
}

/** Every marker segment before the image data, as [marker, payload]. */
export function jpegSegments(jpeg: Uint8Array): { marker: number, payload: Uint8Array }[] {
  const segments: { marker: number, payload: Uint8Array }[] = []
  let pos = 2
  while (pos + 4 <= jpeg.length && jpeg[pos] === 0xFF) {
    const marker = jpeg[pos + 1]!
    const length = (jpeg[pos + 2]! << 8) | jpeg[pos + 3]!
    segments.push({ marker, payload: jpeg.subarray(pos + 4, pos + 2 + length) })
    if (marker === 0xDA) break
    pos += 2 + length
  }
  return segments
}

/** True when the JPEG has any APP1 segment or the bytes "Exif\0" anywhere. */
export function carriesExif(jpeg: Uint8Array): boolean {
  const hasApp1 = jpegSegments(jpeg).some(s => s.marker === 0xE1)
  return hasApp1 || Buffer.from(jpeg).includes(Buffer.from('Exif\0', 'latin1'))
}
