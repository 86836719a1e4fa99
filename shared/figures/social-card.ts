// A published story's picture for link previews (Open Graph, Twitter): 1200 x 630,
// the headline, the key gain in large type and the story's main graph. Pure: it
// writes the SVG, given a way to measure text in the card's face; the server
// outlines the text and renders it to PNG (resvg).
import type { FigureSource } from '../types/story-figures'
import { inlineFigureValue } from '../stories/figure-values'

export const SOCIAL_CARD = { width: 1200, height: 630 } as const
/** Bump when the card's look changes: every cached card is then drawn again. */
export const SOCIAL_CARD_DESIGN = 1

/** The card's address for a story as it is now; a new one whenever the story changes, so previews refresh. */
export function socialCardPath(story: { slug: string, id: number, updatedAt: string }): string {
  return `/api/magazine/stories/${encodeURIComponent(story.slug)}/card.png?v=${socialCardVersion(story)}`
}

export function socialCardVersion(story: { id: number, updatedAt: string }): string {
  return `${SOCIAL_CARD_DESIGN}-${story.id}-${new Date(story.updatedAt).getTime().toString(36)}`
}

export interface KeyGain { text: string, label: string }

/**
 * The story's headline number: the largest peak-to-peak power gain over the
 * baseline among its setups, as the text reports it (rounded, or "within
 * repeatability"); null when there is nothing to compare.
 */
export function keyGain(source: FigureSource): KeyGain | null {
  const rows = source.analysis.table.rows.filter(r => r.vsBaseline && r.setupId !== source.analysis.baselineSetupId)
  if (!rows.length) return null
  const best = rows.reduce((a, b) => (b.vsBaseline!.peakPower > a.vsBaseline!.peakPower ? b : a))
  const value = inlineFigureValue(source, { of: 'peak-power-gain', setup: best.setupId, vs: source.analysis.baselineSetupId })
  if (value.problem) return null
  const signed = value.value !== null && value.value > 0 && !value.withinRepeatability ? `+${value.text}` : value.text
  return { text: signed, label: value.label.replace(/^Peak-to-peak power gain, /, 'Peak power, ') }
}

export type MeasureText = (text: string, sizePx: number, bold: boolean) => number

/** Words into lines no wider than `width`; the last line ends in an ellipsis when there are more. */
export function wrapText(text: string, width: number, maxLines: number, measure: (t: string) => number): string[] {
  const words = text.trim().split(/\s+/).filter(Boolean)
  const lines: string[] = []
  let line = ''
  for (const word of words) {
    const next = line ? `${line} ${word}` : word
    if (!line || measure(next) <= width) line = next
    else {
      lines.push(line)
      line = word
    }
  }
  if (line) lines.push(line)
  if (lines.length <= maxLines) return lines
  const kept = lines.slice(0, maxLines)
  let last = kept[maxLines - 1]!
  while (last.includes(' ') && measure(`${last} …`) > width) last = last.slice(0, last.lastIndexOf(' '))
  kept[maxLines - 1] = `${last} …`
  return kept
}

const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

export interface SocialCardInput {
  siteName: string
  headline: string
  gain: KeyGain | null
  standardLabel: string | null
  /** The graph as SVG, drawn for GRAPH_BOX's size; null for a card without a graph. */
  graphSvg: string | null
  measure: MeasureText
}

const INK = '#14161a'
const SOFT = '#4a5058'
const PAPER = '#fbf8f3'
const ACCENT = '#0072B2'
const MARGIN = 60
/** Where the graph goes on the card, in px. */
export const GRAPH_BOX = { x: 470, y: 218, width: 690, height: 372 } as const

function textLines(lines: string[], x: number, y: number, size: number, lineHeight: number, opts: { bold?: boolean, fill?: string } = {}): string {
  return lines.map((l, i) => `<text x="${x}" y="${y + i * lineHeight}" style="font-size:${size}px;font-weight:${opts.bold ? 700 : 400}" fill="${opts.fill ?? INK}">${escapeXml(l)}</text>`).join('')
}

export function socialCardSvg(input: SocialCardInput): string {
  const { width, height } = SOCIAL_CARD
  const headlineSize = 50
  const headlineWidth = width - 2 * MARGIN
  const headline = wrapText(input.headline, headlineWidth, 2, t => input.measure(t, headlineSize, true))
  const parts: string[] = [
    `<rect width="${width}" height="${height}" fill="${PAPER}"/>`,
    `<rect width="${width}" height="10" fill="${ACCENT}"/>`,
    textLines([input.siteName], MARGIN, 62, 22, 0, { bold: true, fill: SOFT }),
    textLines(headline, MARGIN, 128, headlineSize, 60, { bold: true }),
  ]
  const left = input.graphSvg ? GRAPH_BOX.x - MARGIN - 30 : width - 2 * MARGIN
  if (input.gain) {
    let gainSize = 104
    while (gainSize > 48 && input.measure(input.gain.text, gainSize, true) > left) gainSize -= 4
    parts.push(textLines([input.gain.text], MARGIN, 340, gainSize, 0, { bold: true, fill: ACCENT }))
    parts.push(textLines(wrapText(input.gain.label, left, 3, t => input.measure(t, 24, false)), MARGIN, 392, 24, 32))
  }
  if (input.standardLabel) {
    parts.push(textLines(wrapText(`Corrected to ${input.standardLabel}`, left, 2, t => input.measure(t, 18, false)), MARGIN, 540, 18, 24, { fill: SOFT }))
  }
  if (input.graphSvg) {
    const inner = input.graphSvg.replace(/^<svg[^>]*>/, '').replace(/<\/svg>\s*$/, '')
    parts.push(`<rect x="${GRAPH_BOX.x - 10}" y="${GRAPH_BOX.y - 10}" width="${GRAPH_BOX.width + 20}" height="${GRAPH_BOX.height + 20}" rx="8" fill="#ffffff" stroke="#e2d9cb"/>`)
    parts.push(`<svg x="${GRAPH_BOX.x}" y="${GRAPH_BOX.y}" width="${GRAPH_BOX.width}" height="${GRAPH_BOX.height}" viewBox="0 0 ${GRAPH_BOX.width} ${GRAPH_BOX.height}">${inner}</svg>`)
  }
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${parts.join('')}</svg>`
}
