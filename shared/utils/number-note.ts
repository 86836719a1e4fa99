// How the number check's findings are shown to people who never see the Markdown
// source (issue 15 item 5): each finding quotes the sentence it was found in, its note
// prints numbers as the page does ("5,380 rpm", thousands grouped), and it is placed
// beside the paragraph that holds it in the preview. The check itself is
// shared/utils/number-check.ts and the server's route; this file only presents it.
import type { FigureUnit } from '../types/story-figures'
import type { NumberFinding } from '../types/stories'
import { formatReported, withUnitNbsp } from './figures'
import { proseLines } from './story-markup'

export interface NumberQuote { before: string, number: string, after: string }

export interface PlacedFinding {
  key: string
  /** The number as written ("108 hp"). */
  text: string
  /** Among the findings with the same text, this one's place (0 = first in the body). */
  occurrence: number
  /** Agrees with no figure, or agrees with a gain that is within repeatability. */
  attention: boolean
  quote: NumberQuote
  note: string
}

const QUOTE_MAX = 220

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/** The number as written, found the way the check finds it (not inside a longer number or word). */
export function numberPattern(text: string, flags = 'gi'): RegExp {
  const body = text.trim().split(/\s+/).map(escape).join('\\s*')
  return new RegExp(`(?<![\\w.,])${body}(?![A-Za-z])`, flags)
}

export function countNumber(haystack: string, text: string): number {
  return [...haystack.matchAll(numberPattern(text))].length
}

// Markdown's own marks, which a reader never sees.
function plainLine(line: string): string {
  return line
    .replace(/^\s{0,3}(?:#{1,6}\s+|>\s*|[-*+]\s+|\d+[.)]\s+)/, '')
    .replace(/(\*\*|__|~~)/g, '')
    .replace(/(^|[\s(])[*_](?=\S)|(?<=\S)[*_](?=[\s).,;:!?]|$)/g, '$1')
    .replace(/[[\]]/g, '')
    .replace(/\s+/g, ' ')
    .trim()
}

// A full stop after these ends no sentence ("vs. the stock cam"), nor the one in "29.1 in. Hg".
const ABBREVIATION = /\b(?:vs|approx|e\.g|i\.e|no|fig)\.$/i
const SENTENCE_END = /[.!?]+["”’)]*\s+(?=["“‘(]?[A-Z0-9])/g

function sentenceAround(line: string, at: number): { start: number, end: number } {
  let start = 0
  let end = line.length
  for (const m of line.matchAll(SENTENCE_END)) {
    const stop = m.index + 1
    if (ABBREVIATION.test(line.slice(0, stop)) || (/\bin\.$/i.test(line.slice(0, stop)) && /^Hg\b/.test(line.slice(m.index + m[0].length)))) continue
    const next = m.index + m[0].length
    if (next <= at) start = next
    else {
      end = m.index + m[0].trimEnd().length
      break
    }
  }
  return { start, end }
}

/** The sentence a finding was found in, split around the number, shortened around it when long. */
export function findingQuote(body: string, finding: Pick<NumberFinding, 'line' | 'text'>): NumberQuote {
  const line = plainLine(proseLines(body)[finding.line - 1] ?? '')
  const m = numberPattern(finding.text, 'i').exec(line)
  if (!m) return { before: '', number: finding.text, after: '' }
  const { start, end } = sentenceAround(line, m.index)
  let before = line.slice(start, m.index)
  let after = line.slice(m.index + m[0].length, end)
  const room = Math.max(40, Math.floor((QUOTE_MAX - m[0].length) / 2))
  if (before.length > room) before = `…${before.slice(before.length - room).replace(/^\S*\s/, '')}`
  if (after.length > room) after = `${after.slice(0, room).replace(/\s\S*$/, '')}…`
  return { before, number: m[0], after }
}

const figure = (value: number, unit: FigureUnit) => withUnitNbsp(formatReported(value, unit === 'rpm' || Number.isInteger(value) ? 0 : 1), unit)

/** What the data says about a finding, numbers grouped as the page prints them. */
export function findingNote(finding: NumberFinding): string {
  const m = finding.matched
  if (m) {
    return m.withinRepeatability
      ? `Agrees with ${m.label} (${figure(m.value, finding.unit)}), but that gain is within repeatability: say so rather than call it a gain.`
      : `Agrees with ${m.label} (${figure(m.value, finding.unit)}).`
  }
  // One label per value: three figures that all come to 6,000 rpm read as one.
  const [first, ...others] = finding.nearest.filter((n, i, all) => all.findIndex(o => o.value === n.value) === i)
  if (!first) return `The data gives no figure in ${finding.unit}.`
  const more = others.length ? ` Also close: ${others.map(n => `${figure(n.value, n.unit)} (${n.label})`).join('; ')}.` : ''
  return `The data gives ${figure(first.value, first.unit)} (${first.label}).${more}`
}

const normal = (text: string) => text.replace(/\s+/g, ' ').trim().toLowerCase()

/** Every finding ready to show: its quote, its note and which occurrence of its text it is. */
export function placeFindings(body: string, findings: readonly NumberFinding[]): PlacedFinding[] {
  const seen = new Map<string, number>()
  return findings.map((f, i) => {
    const occurrence = seen.get(normal(f.text)) ?? 0
    seen.set(normal(f.text), occurrence + 1)
    return {
      key: `${i}:${f.line}:${f.text}`,
      text: f.text,
      occurrence,
      attention: !f.matched || f.matched.withinRepeatability === true,
      quote: findingQuote(body, f),
      note: findingNote(f),
    }
  })
}

/**
 * The findings that belong to one block of the rendered text, walking the blocks in
 * document order: `counts` carries how often each number was met in earlier blocks,
 * so the second "31 hp" in the text lands beside the second paragraph that has one.
 */
export function findingsInBlock(blockText: string, placed: readonly PlacedFinding[], counts: Map<string, number>): PlacedFinding[] {
  const here: PlacedFinding[] = []
  const texts = new Set(placed.map(p => normal(p.text)))
  for (const text of texts) {
    const inBlock = countNumber(blockText, text)
    if (!inBlock) continue
    const before = counts.get(text) ?? 0
    counts.set(text, before + inBlock)
    for (const p of placed) {
      if (normal(p.text) === text && p.occurrence >= before && p.occurrence < before + inBlock) here.push(p)
    }
  }
  return here
}
