// What a file is, judged from its first bytes rather than its name or the type the
// sender claims. Pull files are text; anything else is named by its signature when
// it has a well-known one (file signatures as listed by the formats' own specs:
// JPEG SOI FF D8 FF, PNG's 8-byte header, "%PDF-", ZIP local header "PK\x03\x04" ...).

export type SniffedFile = { text: true } | { text: false, kind: string }

/** Bytes looked at; a pull file's header and first rows are well inside this. */
export const SNIFF_BYTES = 4096

const SIGNATURES: readonly { kind: string, bytes: readonly number[], offset?: number }[] = [
  { kind: 'a JPEG image', bytes: [0xFF, 0xD8, 0xFF] },
  { kind: 'a PNG image', bytes: [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A] },
  { kind: 'a GIF image', bytes: [0x47, 0x49, 0x46, 0x38] },
  { kind: 'a WebP image', bytes: [0x57, 0x45, 0x42, 0x50], offset: 8 },
  { kind: 'a HEIC/AVIF image or a video', bytes: [0x66, 0x74, 0x79, 0x70], offset: 4 },
  { kind: 'a TIFF image', bytes: [0x49, 0x49, 0x2A, 0x00] },
  { kind: 'a TIFF image', bytes: [0x4D, 0x4D, 0x00, 0x2A] },
  { kind: 'a PDF document', bytes: [0x25, 0x50, 0x44, 0x46, 0x2D] },
  { kind: 'a ZIP archive (or a spreadsheet workbook)', bytes: [0x50, 0x4B, 0x03, 0x04] },
  { kind: 'an old-style Office document', bytes: [0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1] },
  { kind: 'a gzip archive', bytes: [0x1F, 0x8B] },
  { kind: 'a 7-Zip archive', bytes: [0x37, 0x7A, 0xBC, 0xAF, 0x27, 0x1C] },
  { kind: 'a RAR archive', bytes: [0x52, 0x61, 0x72, 0x21, 0x1A, 0x07] },
  { kind: 'a UTF-16 text file (save it as UTF-8)', bytes: [0xFF, 0xFE] },
  { kind: 'a UTF-16 text file (save it as UTF-8)', bytes: [0xFE, 0xFF] },
]

function startsWith(head: Uint8Array, bytes: readonly number[], offset = 0): boolean {
  if (head.length < offset + bytes.length) return false
  return bytes.every((b, i) => head[offset + i] === b)
}

/**
 * Text means: no known binary signature and no NUL or other control bytes than tab,
 * line breaks and form feed. Text in another encoding than UTF-8 still counts as
 * text: the pull check names the line the writer has to look at.
 */
export function sniffFile(head: Uint8Array): SniffedFile {
  for (const s of SIGNATURES) {
    if (startsWith(head, s.bytes, s.offset)) return { text: false, kind: s.kind }
  }
  const end = Math.min(head.length, SNIFF_BYTES)
  for (let i = 0; i < end; i++) {
    const b = head[i]!
    if ((b < 0x20 && b !== 0x09 && b !== 0x0A && b !== 0x0D && b !== 0x0C) || b === 0x7F) return { text: false, kind: 'a binary file' }
  }
  return { text: true }
}
