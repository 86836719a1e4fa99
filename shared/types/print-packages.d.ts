// Types for the parts of fontkit and svg-to-pdfkit the figure exports use (neither ships its own).
declare module 'fontkit' {
  export interface Path { toSVG(): string, translate(x: number, y: number): Path }
  export interface Glyph { path: Path, advanceWidth: number }
  export interface GlyphRun { glyphs: Glyph[], positions: { xAdvance: number, xOffset: number, yOffset: number }[], advanceWidth: number }
  export interface Font { unitsPerEm: number, ascent: number, descent: number, familyName: string, layout(text: string): GlyphRun }
  export function create(buffer: Buffer): Font
}

declare module 'svg-to-pdfkit' {
  interface SvgToPdfOptions {
    width?: number
    height?: number
    preserveAspectRatio?: string
    assumePt?: boolean
    fontCallback?: (family: string, bold: boolean, italic: boolean) => string
  }
  export default function SVGtoPDF(doc: PDFKit.PDFDocument, svg: string, x: number, y: number, options?: SvgToPdfOptions): void
}
