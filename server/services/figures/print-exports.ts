// The print desk's files: one figure at one column width as SVG or PDF (graphs),
// PDF or CSV (the results table). Column widths come from the site settings.
import { z } from 'zod'
import { PRINT_COLUMNS, type PrintColumns, type PrintColumnsMm } from '#shared/figures/print-style'
import { GRAPH_FIGURES, TABLE_FIGURES, standaloneFigureLabel, type StandaloneFigure } from '#shared/figures/story-figure-list'
import { graphModel, requireStandaloneFigure, tableModel } from './figure-model'
import { graphPdf, graphSvgFile, printedGraph, resultsTableCsv, resultsTablePdf } from './print-render'
import type { FigureStory } from './story-source'
import { getSiteSettings } from '../magazine/settings'
import type { Db } from '../../utils/db'

export const PRINT_FORMATS = ['svg', 'pdf', 'csv'] as const
export type PrintFormat = typeof PRINT_FORMATS[number]

export const PrintExportQuery = z.object({
  format: z.enum(PRINT_FORMATS, { message: `Use one of ${PRINT_FORMATS.join(', ')}` }),
  columns: z.enum(PRINT_COLUMNS, { message: `Use one of ${PRINT_COLUMNS.join(', ')}` }).default('two'),
})

export const PrintFigureParams = z.object({
  id: z.coerce.number().int().positive(),
  number: z.coerce.number().int().positive().max(500),
})

/** The print edition's column widths in millimetres (site settings). */
export async function printColumnsMm(db: Db): Promise<PrintColumnsMm> {
  return (await getSiteSettings(db)).printColumnsMm
}

export interface PrintFile { body: Buffer | string, contentType: string, fileName: string }

const CONTENT_TYPES: Record<PrintFormat, string> = { svg: 'image/svg+xml; charset=utf-8', pdf: 'application/pdf', csv: 'text/csv; charset=utf-8' }

/** Which formats a figure has: drawings as SVG and PDF, the results table as PDF and CSV. */
export function printFormatsOf(figure: Pick<StandaloneFigure, 'name'>): PrintFormat[] {
  if (GRAPH_FIGURES.includes(figure.name)) return ['svg', 'pdf']
  if (TABLE_FIGURES.includes(figure.name)) return ['pdf', 'csv']
  return []
}

export function printFileName(story: Pick<FigureStory, 'slug'>, figure: Pick<StandaloneFigure, 'number' | 'name'>, columns: PrintColumns, format: PrintFormat): string {
  return format === 'csv' ? `${story.slug}-figure-${figure.number}-${figure.name}.csv` : `${story.slug}-figure-${figure.number}-${figure.name}-${columns}-column.${format}`
}

export async function printFile(story: FigureStory, figure: StandaloneFigure, format: PrintFormat, columns: PrintColumns, widths: PrintColumnsMm): Promise<PrintFile> {
  if (!printFormatsOf(figure).includes(format)) {
    const offered = printFormatsOf(figure)
    throw createError({
      statusCode: 422,
      statusMessage: 'Unprocessable Entity',
      message: offered.length ? `Figure ${figure.number} is exported as ${offered.join(' or ')}, not ${format}.` : `Figure ${figure.number} has no print export; take it from the page.`,
    })
  }
  const widthMm = widths[columns]
  const meta = { title: `${story.headline}: ${standaloneFigureLabel(figure)}`, subject: `${columns}-column figure, ${widthMm} mm wide` }
  const fileName = printFileName(story, figure, columns, format)
  if (TABLE_FIGURES.includes(figure.name)) {
    const model = tableModel(figure, story.figures)
    const body = format === 'csv' ? resultsTableCsv(model) : await resultsTablePdf(model, widthMm, meta)
    return { body, contentType: CONTENT_TYPES[format], fileName }
  }
  const graph = printedGraph(graphModel(figure, story.figures), widthMm)
  const body = format === 'svg' ? await graphSvgFile(graph, meta.title) : await graphPdf(graph, meta)
  return { body, contentType: CONTENT_TYPES[format], fileName }
}

export async function storyPrintFile(db: Db, story: FigureStory, number: number, format: PrintFormat, columns: PrintColumns): Promise<PrintFile> {
  return printFile(story, requireStandaloneFigure(story.body, number), format, columns, await printColumnsMm(db))
}
