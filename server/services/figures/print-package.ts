// The print package: one ZIP with everything the print edition's layout needs
// from a story: each figure at every column width (graphs as SVG and PDF, the
// results table as PDF and CSV), the story's photos at full size (the uploaded
// originals; they are only for the desk) and a text file of captions and credits.
import type { H3Event } from 'h3'
import type { Db } from '../../utils/db'
import archiver from 'archiver'
import { PRINT_COLUMNS } from '#shared/figures/print-style'
import { standaloneFigureLabel, standaloneFigures } from '#shared/figures/story-figure-list'
import { PHOTO_FORMATS } from '#shared/types/photos'
import type { PhotoRecord } from '../photos/access'
import { graphModel, tableModel } from './figure-model'
import { printColumnsMm, printFile, printFormatsOf } from './print-exports'
import type { FigureStory } from './story-source'
import { streamPhotoObject, whilePhotoStorageAnswers } from '../photos/storage'

const extensionOf = (mime: string) => PHOTO_FORMATS.find(f => f.mime === mime)?.id.replace('jpeg', 'jpg') ?? 'bin'

async function objectBytes(key: string): Promise<Buffer | null> {
  const object = await streamPhotoObject(key)
  if (!object) return null
  const chunks: Buffer[] = []
  for await (const chunk of object.body) chunks.push(Buffer.from(chunk as Uint8Array))
  return Buffer.concat(chunks)
}

function captionsText(story: FigureStory, figureLines: string[], photoLines: string[]): string {
  return [
    story.headline,
    story.deck,
    story.bylines.length ? `By ${story.bylines.join(', ')}` : '',
    '',
    'FIGURES',
    ...(figureLines.length ? figureLines : ['(none)']),
    '',
    'PHOTOS',
    ...(photoLines.length ? photoLines : ['(none)']),
    '',
  ].join('\r\n')
}

/** Streams the story's print package as the response (the files are made one at a time). */
export async function sendPrintPackage(db: Db, event: H3Event, story: FigureStory): Promise<void> {
  const widths = await printColumnsMm(db)
  const figures = standaloneFigures(story.body).filter(f => printFormatsOf(f).length)
  const photos = story.photoIds.length
    ? await db<PhotoRecord>('photos').whereIn('id', story.photoIds).where('bench_test_id', story.figures.benchTestId)
    : []

  // Everything that can fail (a figure that cannot be drawn, storage away) fails
  // before the first byte is sent, so a broken download is an error, not a bad ZIP.
  const files: { name: string, body: Buffer | string }[] = []
  const figureLines: string[] = []
  for (const figure of figures) {
    const folder = `figures/figure-${figure.number}-${figure.name}`
    const model = figure.name === 'results-table' ? tableModel(figure, story.figures) : graphModel(figure, story.figures)
    figureLines.push(`${standaloneFigureLabel(figure)}`, `  ${model.title}. ${model.note}`, `  Files: ${folder}/`)
    for (const format of printFormatsOf(figure)) {
      for (const columns of format === 'csv' ? (['two'] as const) : PRINT_COLUMNS) {
        const file = await printFile(story, figure, format, columns, widths)
        files.push({ name: `${folder}/${file.fileName}`, body: file.body })
      }
    }
  }
  const photoLines: string[] = []
  for (const id of story.photoIds) {
    const photo = photos.find(p => p.id === id)
    if (!photo) continue
    const name = `photos/photo-${photo.id}.${extensionOf(photo.mime)}`
    const bytes = await whilePhotoStorageAnswers(() => objectBytes(photo.original_key))
    if (!bytes) continue
    files.push({ name, body: bytes })
    photoLines.push(name, `  Caption: ${photo.caption || '(none)'}`, `  Credit: ${photo.credit || '(none)'}`, `  Alt text: ${photo.alt_text || '(none)'}`, `  ${photo.width} x ${photo.height} px`)
  }
  files.push({ name: 'captions-and-credits.txt', body: captionsText(story, figureLines, photoLines) })

  const archive = archiver('zip', { zlib: { level: 6 } })
  for (const file of files) archive.append(file.body, { name: `${story.slug}/${file.name}` })
  setResponseHeaders(event, {
    'content-type': 'application/zip',
    'content-disposition': `attachment; filename="${story.slug}-print.zip"`,
    'cache-control': 'private, no-store',
  })
  void archive.finalize()
  return sendStream(event, archive)
}
