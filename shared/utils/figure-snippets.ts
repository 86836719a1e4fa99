// The MDC text the editor's figure picker puts into a story body, built from the
// options chosen, checked by the same schemas the server and the figures use.
import { BLOCK_FIGURES, FigureValueProps, INLINE_FIGURE_NAME, type BlockFigureName } from '../types/story-figures'
import { parseMdcAttributes } from './story-markup'

export type SnippetValue = string | number | readonly number[] | undefined | null

// Captions are free text inside an attribute: a double quote, a brace or a line
// break would end the attribute (or the braces) early, so they are replaced.
function attributeValue(value: string): string {
  return value.replace(/[\r\n]+/g, ' ').replace(/"/g, '\u201D').replace(/[{}]/g, m => (m === '{' ? '(' : ')')).trim()
}

function attributes(options: Record<string, SnippetValue>): string {
  const parts: string[] = []
  for (const [key, raw] of Object.entries(options)) {
    if (raw === undefined || raw === null || raw === '') continue
    if (Array.isArray(raw)) {
      if (raw.length) parts.push(`${key}="${raw.join(',')}"`)
    }
    else if (typeof raw === 'number') parts.push(`${key}=${raw}`)
    else parts.push(`${key}="${attributeValue(String(raw))}"`)
  }
  return parts.length ? `{${parts.join(' ')}}` : ''
}

export interface SnippetResult { text: string, problems: string[] }

/** A block figure on its own lines, closed with "::", or the problems of its options. */
export function blockFigureSnippet(name: BlockFigureName, options: Record<string, SnippetValue>): SnippetResult {
  const figure = BLOCK_FIGURES.find(f => f.name === name)
  if (!figure) return { text: '', problems: [`"${name}" is not a figure.`] }
  const attrs = attributes(options)
  // Checked as the server will read it back: from the text, as MDC hands it over.
  const checked = figure.schema.safeParse(attrs ? parseMdcAttributes(attrs) : {})
  if (!checked.success) return { text: '', problems: checked.error.issues.map(i => `${i.path.join('.') || name}: ${i.message}`) }
  return { text: `::${name}${attrs}\n::`, problems: [] }
}

/** An inline value, to sit inside a sentence. */
export function inlineValueSnippet(options: { of: string, setup: number, vs?: number, decimals?: number }): SnippetResult {
  const attrs = attributes({ of: options.of, setup: options.setup, vs: options.vs, decimals: options.decimals })
  const checked = FigureValueProps.safeParse(parseMdcAttributes(attrs))
  if (!checked.success) return { text: '', problems: checked.error.issues.map(i => `${i.path.join('.') || 'value'}: ${i.message}`) }
  return { text: `:${INLINE_FIGURE_NAME}${attrs}`, problems: [] }
}

/**
 * The body with a snippet placed at the cursor: a block figure gets blank lines
 * around it (MDC needs a block on its own lines), an inline value goes in as is.
 * Returns the new text and where the cursor lands (after the snippet).
 */
export function insertSnippet(body: string, at: number, snippet: string, kind: 'block' | 'inline'): { body: string, cursor: number } {
  const pos = Math.max(0, Math.min(at, body.length))
  if (kind === 'inline') {
    const before = body.slice(0, pos)
    const spaced = before && !/\s$/.test(before) ? ` ${snippet}` : snippet
    return { body: before + spaced + body.slice(pos), cursor: pos + spaced.length }
  }
  // A block starts on a fresh line: move to the end of the line the cursor is on.
  const lineEnd = body.indexOf('\n', pos)
  const cut = pos === 0 || body[pos - 1] === '\n' ? pos : lineEnd === -1 ? body.length : lineEnd
  const before = body.slice(0, cut).replace(/\n*$/, '')
  const after = body.slice(cut).replace(/^\n*/, '')
  const lead = before ? '\n\n' : ''
  const text = `${before}${lead}${snippet}\n\n${after}`
  return { body: text, cursor: before.length + lead.length + snippet.length + 2 }
}
