// Checking a story body (Markdown with MDC figures) without rendering it: its
// figures' options against the bench test, the photos it uses and the markup that
// could run script. Pure; line numbers are 1-based lines of the body as stored.
// Finding the figures is story-markup.ts, which the reader's page needs alone.
import { BLOCK_FIGURES, FigureValueProps, INLINE_FIGURE_NAME, type FigureOptionsSchema } from '../types/story-figures'
import { findFigures, type FigureUse } from './story-markup'

export interface BodyIssue { line: number, message: string }

const SCHEMAS: Record<string, FigureOptionsSchema<object>> = Object.fromEntries(BLOCK_FIGURES.map(f => [f.name, f.schema]))

/** The figure's options checked by its schema, or null for an unknown figure. */
export function parseFigure(use: FigureUse) {
  const schema = use.kind === 'inline' ? (use.name === INLINE_FIGURE_NAME ? FigureValueProps : undefined) : SCHEMAS[use.name]
  return schema ? schema.safeParse(use.props) : null
}

export interface FigureContext {
  /** Live setups of the bench test. */
  setupIds: ReadonlySet<number>
  /** Setups with included pulls (graphs, tables and values need data). */
  analysedSetupIds: ReadonlySet<number>
  photoIds: ReadonlySet<number>
}

const idsOf = (v: unknown): number[] => (Array.isArray(v) ? v.filter((x): x is number => typeof x === 'number') : typeof v === 'number' ? [v] : [])

/** What is wrong with the body's figures, figure by figure (empty: all can be shown). */
export function figureProblems(body: string, ctx: FigureContext): { line: number, figure: string, message: string }[] {
  const problems: { line: number, figure: string, message: string }[] = []
  for (const use of findFigures(body)) {
    // Closing "::" lines and MDC's own prose components are not ours to judge.
    const parsed = parseFigure(use)
    const add = (message: string) => problems.push({ line: use.line, figure: use.source, message })
    if (!parsed) {
      if (use.kind === 'block') add(`"${use.name}" is not a figure Pullsheet knows.`)
      else if (use.name.includes('figure')) add(`"${use.name}" is not a figure Pullsheet knows; inline values are written :${INLINE_FIGURE_NAME}{...}.`)
      continue
    }
    if (!parsed.success) {
      for (const issue of parsed.error.issues) add(`${issue.path.join('.') || use.name}: ${issue.message}`)
      continue
    }
    const opts = parsed.data as Record<string, unknown>
    const setupRefs = [...idsOf(opts.setups), ...idsOf(opts.setup), ...idsOf(opts.baseline), ...idsOf(opts.vs)]
    for (const id of setupRefs) {
      if (!ctx.setupIds.has(id)) add(`Setup ${id} is not a setup of this bench test.`)
      else if (use.name !== 'cam-card' && !ctx.analysedSetupIds.has(id)) add(`Setup ${id} has no included pulls yet.`)
    }
    const photoRefs = use.name === 'photo' ? idsOf(opts.id) : use.name === 'gallery' ? idsOf(opts.ids) : []
    for (const id of photoRefs) if (!ctx.photoIds.has(id)) add(`Photo ${id} is not a photo of this bench test.`)
  }
  return problems
}

/** Photo ids placed in the body by ::photo and ::gallery, in order, once each. */
export function photosUsed(body: string): number[] {
  const ids: number[] = []
  for (const use of findFigures(body)) {
    if (use.kind !== 'block' || (use.name !== 'photo' && use.name !== 'gallery')) continue
    const parsed = parseFigure(use)
    if (!parsed?.success) continue
    const opts = parsed.data as Record<string, unknown>
    ids.push(...idsOf(use.name === 'photo' ? opts.id : opts.ids))
  }
  return [...new Set(ids)]
}

// ---------- markup that could run script ----------

const FORBIDDEN_TAGS = ['script', 'iframe', 'frame', 'frameset', 'object', 'embed', 'applet', 'style', 'link', 'meta', 'base', 'form', 'input', 'button', 'textarea', 'select', 'svg', 'math', 'template', 'noscript', 'portal']
const FORBIDDEN_TAG = new RegExp(`<\\s*/?\\s*(${FORBIDDEN_TAGS.join('|')})\\b`, 'gi')
// A raw tag or an MDC attribute group ({...} after a component or a [span]).
const TAG_OR_ATTRIBUTES = /<[a-z!/][^>]*>?|\{[^}\n]*\}?/gi
const EVENT_HANDLER = /(?:^|[\s"'/{;])on[a-z]+\s*=/i
const SCRIPT_SCHEMES = /(?:java|vb|live)script:|data:\s*text\/html/i

function decodeEntities(text: string): string {
  return text
    .replace(/&#x([0-9a-f]+);?/gi, (_, hex: string) => String.fromCodePoint(Number.parseInt(hex, 16) % 0x110000))
    .replace(/&#(\d+);?/g, (_, dec: string) => String.fromCodePoint(Number(dec) % 0x110000))
    .replace(/&colon;/gi, ':').replace(/&tab;/gi, '\t').replace(/&newline;/gi, '\n')
}

/**
 * Markup refused in a stored body, whatever renders it later: script-capable tags,
 * event-handler attributes (in raw HTML and in MDC attributes) and script URLs
 * (also when spelled with entities, tabs or line breaks inside the scheme).
 */
export function bodySafetyIssues(body: string): BodyIssue[] {
  const issues: BodyIssue[] = []
  const lines = body.split('\n')
  lines.forEach((line, i) => {
    const at = i + 1
    for (const m of line.matchAll(FORBIDDEN_TAG)) issues.push({ line: at, message: `Line ${at}: a <${m[1]!.toLowerCase()}> tag is not allowed in a story.` })
    for (const m of line.matchAll(TAG_OR_ATTRIBUTES)) {
      if (EVENT_HANDLER.test(decodeEntities(m[0]))) issues.push({ line: at, message: `Line ${at}: event-handler attributes (on...=) are not allowed in a story.` })
    }
  })
  // Schemes may be split over lines or hidden in entities and control characters.
  // eslint-disable-next-line no-control-regex -- control characters are exactly what hides a scheme
  const squeezed = decodeEntities(body).replace(/[\s\u0000-\u001f\u007f-\u009f\u200b-\u200d\ufeff\\]+/g, '')
  if (SCRIPT_SCHEMES.test(squeezed)) {
    const line = lines.findIndex(l => /script|data:/i.test(decodeEntities(l))) + 1 || 1
    issues.push({ line, message: `Line ${line}: javascript:, vbscript: and data:text/html addresses are not allowed in a story.` })
  }
  return issues
}
