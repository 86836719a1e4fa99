// A figure drawn for the print edition at one column width: ECharts' SVG at the
// size in points (print-style.ts dresses the options), then an SVG file with its
// text outlined and its size in millimetres, or a one-page PDF of exactly that
// size with the print face embedded (pdfkit and svg-to-pdfkit). A results table
// becomes a tagged PDF table (or CSV, written by the route).
import * as echarts from 'echarts/core'
import { LineChart } from 'echarts/charts'
import { GridComponent, LegendComponent, MarkLineComponent } from 'echarts/components'
import { SVGRenderer } from 'echarts/renderers'
import PDFDocument from 'pdfkit'
import SVGtoPDF from 'svg-to-pdfkit'
import { PRINT_FONT, printGraphOption, printGraphSize, ptToMm, type PrintSize } from '#shared/figures/print-style'
import type { PullChartOption } from '#shared/utils/chart-options'
import { writeCsv } from '#shared/dyno'
import { RESULTS_COLUMNS, type GraphModel, type TableModel } from './figure-model'
import { PRINT_FONT_BOLD, printFonts } from './fonts'
import { outlineSvgText } from './svg-text-outline'

echarts.use([LineChart, GridComponent, LegendComponent, MarkLineComponent, SVGRenderer])

/** ECharts' SVG of the options at this size (in user units), without its hover styles and class names. */
export function drawChartSvg(option: PullChartOption, width: number, height: number): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height })
  try {
    chart.setOption(option)
    return chart.renderToSVGString()
      .replace(/<style[\s\S]*?<\/style>/g, '')
      .replace(/\sclass="zr\d+-cls-\d+"/g, '')
      .replace(/\spointer-events="[^"]*"/g, '')
  }
  finally {
    chart.dispose()
  }
}

export interface PrintedGraph { svg: string, size: PrintSize }

/** The graph at a column width, in points, with its text still as text (for the PDF). */
export function printedGraph(model: GraphModel, widthMm: number): PrintedGraph {
  const size = printGraphSize(widthMm, model.view)
  const option = printGraphOption(model.option, size)
  return { svg: drawChartSvg(option, size.widthPt, size.heightPt), size }
}

/** The SVG file: millimetre size for layout programs, the print face as outlines. */
export async function graphSvgFile(graph: PrintedGraph, title: string): Promise<string> {
  const { outline } = await printFonts()
  const escaped = title.replace(/&/g, '&amp;').replace(/</g, '&lt;')
  return `<?xml version="1.0" encoding="UTF-8"?>\n${outlineSvgText(graph.svg, outline)
    .replace(/^<svg width="[^"]*" height="[^"]*"/, `<svg width="${graph.size.widthMm}mm" height="${graph.size.heightMm}mm"`)
    .replace(/(<svg[^>]*>)/, `$1<title>${escaped}</title>`)}`
}

function pdfBuffer(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    doc.on('data', (chunk: Buffer) => chunks.push(chunk))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
    doc.end()
  })
}

interface PdfMeta { title: string, subject: string }

async function newDocument(size: [number, number], meta: PdfMeta, tagged = false): Promise<PDFKit.PDFDocument> {
  const fonts = await printFonts()
  const doc = new PDFDocument({
    size,
    margin: 0,
    autoFirstPage: true,
    pdfVersion: '1.7',
    tagged,
    lang: 'en',
    displayTitle: true,
    info: { Title: meta.title, Subject: meta.subject, Creator: 'Pullsheet', Producer: 'Pullsheet (pdfkit)' },
  })
  doc.registerFont(PRINT_FONT, fonts.regular)
  doc.registerFont(PRINT_FONT_BOLD, fonts.bold)
  doc.font(PRINT_FONT)
  return doc
}

/** One page exactly the graph's size; its labels stay text in the embedded print face. */
export async function graphPdf(graph: PrintedGraph, meta: PdfMeta): Promise<Buffer> {
  const doc = await newDocument([graph.size.widthPt, graph.size.heightPt], meta)
  SVGtoPDF(doc, graph.svg, 0, 0, {
    width: graph.size.widthPt,
    height: graph.size.heightPt,
    assumePt: true,
    fontCallback: (_family, bold) => (bold ? PRINT_FONT_BOLD : PRINT_FONT),
  })
  return pdfBuffer(doc)
}

const TABLE = { padPt: 3, fontPt: 7, headPt: 7, titlePt: 8.5, rowGapPt: 2 }

/**
 * The results table as a tagged PDF (Table, TR, TH, TD structure) at a column width:
 * below three columns one block per setup (measure and value), at three the page's
 * own grid.
 */
export async function resultsTablePdf(model: TableModel, widthMm: number, meta: PdfMeta): Promise<Buffer> {
  const widthPt = widthMm / ptToMm(1)
  // Nine columns need about 450 pt at 7 pt type (three columns of the default page).
  const narrow = widthPt < 450
  const head = narrow ? ['Measure', 'Value'] : RESULTS_COLUMNS.map(c => c.label)
  const body: string[][] = narrow
    ? model.rows.flatMap(r => [[r.label, r.isBaseline ? 'baseline' : ''], ...RESULTS_COLUMNS.slice(1).map(c => [`  ${c.label}`, String(r[c.key])])])
    : model.rows.map(r => RESULTS_COLUMNS.map(c => String(c.key === 'label' && r.isBaseline ? `${r.label} (baseline)` : r[c.key])))
  const weights = narrow ? [1.1, 1] : [1.6, 1.35, 1.35, 1, 1.1, 1.1, 1.1, 1.1, 0.9]
  const total = weights.reduce((a, b) => a + b, 0)
  const colW = weights.map(w => (w / total) * widthPt)

  // Measure first (a page exactly as tall as the table), then draw.
  const measure = await newDocument([widthPt, 2000], meta)
  const rowHeight = (cells: string[], bold: boolean) => {
    measure.font(bold ? PRINT_FONT_BOLD : PRINT_FONT).fontSize(TABLE.fontPt)
    return Math.max(...cells.map((c, i) => measure.heightOfString(c || ' ', { width: colW[i]! - 2 * TABLE.padPt }))) + TABLE.rowGapPt * 2
  }
  measure.font(PRINT_FONT_BOLD).fontSize(TABLE.titlePt)
  const titleH = measure.heightOfString(model.title, { width: widthPt })
  measure.font(PRINT_FONT).fontSize(TABLE.fontPt)
  const noteH = measure.heightOfString(model.note, { width: widthPt })
  const headH = rowHeight(head, true)
  const bodyH = body.map(r => rowHeight(r, narrow && !r[0]!.startsWith('  ')))
  const heightPt = Math.ceil(titleH + 4 + headH + bodyH.reduce((a, b) => a + b, 0) + 6 + noteH + 2)
  measure.end()

  const doc = await newDocument([widthPt, heightPt], meta, true)
  let y = 0
  doc.addStructure(doc.struct('H', {}, () => {
    doc.font(PRINT_FONT_BOLD).fontSize(TABLE.titlePt).fillColor('#000').text(model.title, 0, y, { width: widthPt })
  }))
  y += titleH + 4
  const table = doc.struct('Table')
  doc.addStructure(table)
  const drawRow = (cells: string[], h: number, header: boolean, bold: boolean) => {
    const tr = doc.struct('TR')
    table.add(tr)
    let x = 0
    cells.forEach((cell, i) => {
      const left = x
      tr.add(doc.struct(header ? 'TH' : 'TD', {}, () => {
        doc.font(bold ? PRINT_FONT_BOLD : PRINT_FONT).fontSize(TABLE.fontPt).fillColor('#000')
          .text(cell, left + TABLE.padPt, y + TABLE.rowGapPt, { width: colW[i]! - 2 * TABLE.padPt })
      }))
      x += colW[i]!
    })
    tr.end()
    y += h
    doc.markContent('Artifact', { type: 'Layout' })
    doc.moveTo(0, y).lineTo(widthPt, y).lineWidth(header ? 0.6 : 0.3).strokeColor('#000').stroke()
    doc.endMarkedContent()
  }
  drawRow(head, headH, true, true)
  body.forEach((cells, i) => drawRow(cells, bodyH[i]!, false, narrow && !cells[0]!.startsWith('  ')))
  table.end()
  y += 6
  doc.addStructure(doc.struct('P', {}, () => {
    doc.font(PRINT_FONT).fontSize(TABLE.fontPt).fillColor('#000').text(model.note, 0, y, { width: widthPt })
  }))
  return pdfBuffer(doc)
}

/** The results table as CSV for a layout program's table import: the page's columns and texts. */
export function resultsTableCsv(model: TableModel): string {
  return writeCsv([
    RESULTS_COLUMNS.map(c => c.label),
    ...model.rows.map(r => RESULTS_COLUMNS.map(c => (c.key === 'label' && r.isBaseline ? `${r.label} (baseline)` : String(r[c.key])))),
  ])
}
