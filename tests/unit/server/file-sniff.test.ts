// File signatures as the formats define them: JPEG SOI marker FF D8 FF (ITU-T T.81
// annex B), PNG signature (PNG spec, section 5.2), "%PDF-" (ISO 32000-1, 7.5.2), ZIP
// local file header 50 4B 03 04 (PKWARE APPNOTE 4.3.7); UTF-16 byte order marks (Unicode 2.13).
import { describe, expect, it } from 'vitest'
import { sniffFile } from '../../../server/utils/file-sniff'

const bytes = (...b: number[]) => new Uint8Array(b)
const text = (s: string) => new TextEncoder().encode(s)

describe('sniffFile', () => {
  it.each([
    ['a JPEG image', bytes(0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46)],
    ['a PNG image', bytes(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0)],
    ['a PDF document', text('%PDF-1.7\n')],
    ['a ZIP archive (or a spreadsheet workbook)', bytes(0x50, 0x4B, 0x03, 0x04, 0x14, 0)],
    ['a UTF-16 text file (save it as UTF-8)', bytes(0xFF, 0xFE, 0x52, 0x00)],
  ])('names %s', (kind, head) => {
    expect(sniffFile(head)).toEqual({ text: false, kind })
  })

  it('calls a file with NUL or other control bytes binary', () => {
    expect(sniffFile(bytes(0x52, 0x50, 0x4D, 0x00, 0x01))).toEqual({ text: false, kind: 'a binary file' })
  })

  it('takes pull files as text: CSV with tabs, CRLF, a UTF-8 byte order mark and non-ASCII', () => {
    expect(sniffFile(text('\uFEFFRPM,Torque (lb-ft),Note\r\n3000,400,\u00B0F\t\r\n'))).toEqual({ text: true })
    expect(sniffFile(text(''))).toEqual({ text: true })
  })
})
