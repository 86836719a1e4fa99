// The social card of a story (shared/figures/social-card.ts lays it out): its main
// graph drawn at card size, all text outlined in the print face, rendered to PNG
// by resvg. Kept per edition: in this process and in the bucket, so every server
// and every restart draws a story's card once.
import { createHash } from 'node:crypto'
import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3'
import { Resvg } from '@resvg/resvg-js'
import { GRAPH_BOX, SOCIAL_CARD, SOCIAL_CARD_DESIGN, keyGain, socialCardSvg } from '#shared/figures/social-card'
import { GRAPH_FIGURES, standaloneFigures, type StandaloneFigure } from '#shared/figures/story-figure-list'
import { printGraphOption } from '#shared/figures/print-style'
import { LruCache } from '#shared/utils/lru-cache'
import { graphModel } from './figure-model'
import { printFonts } from './fonts'
import { drawChartSvg } from './print-render'
import type { FigureStory } from './story-source'
import { outlineSvgText } from './svg-text-outline'

export interface SocialCard { png: Buffer, etag: string }

const kept = new LruCache<SocialCard>(100)

/** The story's first graph, as power alone (one panel reads at thumbnail size); every setup when the body has none. */
function mainGraph(story: FigureStory): StandaloneFigure | null {
  if (!story.figures.analysis) return null
  const first = standaloneFigures(story.body).find(f => GRAPH_FIGURES.includes(f.name))
  const figure = first ?? { number: 0, name: 'pull-graph' as const, props: {}, line: 0, markup: '' }
  return { ...figure, props: { ...figure.props, channel: 'power' } }
}

function graphSvg(story: FigureStory): string | null {
  const figure = mainGraph(story)
  if (!figure) return null
  try {
    const model = graphModel(figure, story.figures)
    return drawChartSvg(printGraphOption(model.option, { widthPt: GRAPH_BOX.width, heightPt: GRAPH_BOX.height }, 2.2), GRAPH_BOX.width, GRAPH_BOX.height)
  }
  catch {
    return null // a figure that cannot be drawn leaves the card with its words
  }
}

async function drawCard(story: FigureStory): Promise<Buffer> {
  const fonts = await printFonts()
  const analysis = story.figures.analysis
  const svg = socialCardSvg({
    siteName: useAppConfig().magazine.name,
    headline: story.headline,
    gain: analysis ? keyGain({ analysis, comparisons: story.figures.comparisons }) : null,
    standardLabel: analysis?.standardLabel ?? null,
    graphSvg: graphSvg(story),
    measure: (text, size, bold) => {
      const font = bold ? fonts.outline.bold : fonts.outline.regular
      return (font.layout(text).advanceWidth / font.unitsPerEm) * size
    },
  })
  const outlined = outlineSvgText(svg, fonts.outline)
  return new Resvg(outlined, { fitTo: { mode: 'width', value: SOCIAL_CARD.width }, font: { loadSystemFonts: false }, background: '#ffffff' }).render().asPng()
}

const cardKey = (story: FigureStory) => createHash('sha256').update(`${SOCIAL_CARD_DESIGN}|${story.editionKey}`).digest('hex').slice(0, 32)

async function fromBucket(key: string): Promise<Buffer | null> {
  try {
    const answer = await useS3().send(new GetObjectCommand({ Bucket: appConfig().s3.bucket, Key: key }))
    return answer.Body ? Buffer.from(await answer.Body.transformToByteArray()) : null
  }
  catch {
    return null // not drawn yet, or storage away: draw it
  }
}

/** The card for the story as it is now: from this process, the bucket, or drawn (and then kept in both). */
export async function socialCard(story: FigureStory): Promise<SocialCard> {
  const key = cardKey(story)
  const hit = kept.get(key)
  if (hit) return hit
  const objectKey = `social-cards/${story.id}/${key}.png`
  let png = story.preview ? null : await fromBucket(objectKey)
  if (!png) {
    png = await drawCard(story)
    if (!story.preview) {
      await useS3().send(new PutObjectCommand({ Bucket: appConfig().s3.bucket, Key: objectKey, Body: png, ContentType: 'image/png' }))
        .catch(() => undefined) // the card is still served; the next server draws it again
    }
  }
  const card = { png, etag: `"card-${key}"` }
  if (!story.preview) kept.set(key, card)
  return card
}
