// The parsed story body (the MDC tree @nuxtjs/mdc's parser gives) cut down to what
// a story may contain before anything renders it. The server already refuses
// unsafe bodies on save (story-body.ts); this is the second wall, and the one that
// matters for whatever slipped past the first: an allowlist, not a blocklist.
// The renderer (app/components/story/StoryBodyTree.vue) draws every tag and
// attribute it is given as written, `onerror`-style ones too; MDC's would also
// turn any tag into a global component and bind `:prop` values from its context.
import { BLOCK_FIGURES, FigureValueProps, INLINE_FIGURE_NAME } from '../types/story-figures'

export interface StoryAstText { type: 'text', value: string }
export interface StoryAstElement { type: 'element', tag: string, props: Record<string, unknown>, children: StoryAstNode[] }
export type StoryAstNode = StoryAstText | StoryAstElement
export interface StoryAstRoot { type: 'root', children: StoryAstNode[] }

/** Figure names as they are written in the body, each with the props it takes. */
export const FIGURE_TAGS: Readonly<Record<string, readonly string[]>> = Object.fromEntries([
  ...BLOCK_FIGURES.map(f => [f.name, f.schema.names]),
  [INLINE_FIGURE_NAME, FigureValueProps.names],
])

/** Plain text formatting a story may use, with the attributes each keeps. */
const TEXT_TAGS: Readonly<Record<string, readonly string[]>> = {
  p: [], br: [], hr: [],
  h2: [], h3: [], h4: [], h5: [], h6: [],
  strong: [], b: [], em: [], i: [], u: [], s: [], del: [], ins: [],
  sup: [], sub: [], small: [], mark: [], abbr: ['title'], q: [], cite: [],
  code: [], pre: [], kbd: [], blockquote: [],
  ul: [], ol: ['start'], li: [],
  dl: [], dt: [], dd: [],
  table: [], thead: [], tbody: [], tr: [], th: ['align'], td: ['align'],
  a: ['href', 'title'],
  span: [],
}

/** The story's headline is the page's h1: headings in the body start one below. */
const RENAMED: Readonly<Record<string, string>> = { h1: 'h2' }

// Gone with everything inside: their content is code or a document of its own, not text.
const DROPPED_WITH_CONTENT = new Set(['script', 'style', 'iframe', 'frame', 'frameset', 'object', 'embed', 'applet',
  'svg', 'math', 'template', 'noscript', 'textarea', 'select', 'option', 'title', 'head', 'meta', 'link', 'base',
  'portal', 'video', 'audio', 'canvas', 'map', 'input', 'button'])

const MAX_DEPTH = 48

// A tag is looked up among the table's own keys: <constructor> is not Object's.
const own = <T>(table: Readonly<Record<string, T>>, key: string): T | undefined => (Object.hasOwn(table, key) ? table[key] : undefined)

const SAFE_URL = /^(?:https?:\/\/|mailto:|\/(?!\/)|#|\.{1,2}\/)/i
const HAS_SCHEME = /^[a-z][a-z0-9+.-]*:/i

/** A link target a reader may follow: web, mail, or a path on this site; null for anything else. */
export function safeHref(value: unknown): string | null {
  if (typeof value !== 'string') return null
  // Browsers ignore control characters and spaces inside a scheme ("java\tscript:"),
  // and read a backslash as a slash in web addresses: "/\\host" is "//host", another site.
  // eslint-disable-next-line no-control-regex -- exactly the characters that hide a scheme
  const squeezed = value.replace(/[\u0000-\u0020\u007f-\u009f\u200b-\u200d\ufeff]+/g, '').replace(/\\/g, '/')
  if (!squeezed) return null
  if (HAS_SCHEME.test(squeezed) ? !/^(?:https?:\/\/|mailto:)/i.test(squeezed) : squeezed.startsWith('//')) return null
  const href = value.trim().replace(/\\/g, '/')
  if (SAFE_URL.test(squeezed)) return href
  // A bare relative path ("methodology") has no scheme and stays on this site.
  return /^[\w\-.~%/?#=&]+$/.test(squeezed) ? href : null
}

function textOf(node: StoryAstNode): string {
  if (node.type === 'text') return node.value
  return Array.isArray(node.children) ? node.children.map(textOf).join('') : ''
}

function attributeText(value: unknown): string | null {
  if (typeof value === 'string') return value
  if (typeof value === 'number' && Number.isFinite(value)) return String(value)
  if (typeof value === 'boolean') return value ? 'true' : null
  return null
}

function cleanProps(tag: string, props: Record<string, unknown>, allowed: readonly string[]): Record<string, string> {
  const out: Record<string, string> = {}
  for (const [rawKey, value] of Object.entries(props ?? {})) {
    // MDC writes bound props as ":name"; bound values are looked up in the renderer's
    // context, so they come through only as plain text for the figure to validate.
    const key = rawKey.startsWith(':') ? rawKey.slice(1) : rawKey
    if (!allowed.includes(key) || /^on/i.test(key)) continue
    const text = attributeText(value)
    if (text === null) continue
    if (key === 'href') {
      const href = safeHref(text)
      if (href === null) continue
      out.href = href
      if (/^https?:\/\//i.test(href)) out.rel = 'nofollow noopener noreferrer'
      continue
    }
    if (key === 'align' && !['left', 'right', 'center'].includes(text)) continue
    if (key === 'start' && !/^\d{1,6}$/.test(text)) continue
    out[key] = text
  }
  if (tag === 'a' && !out.href) delete out.rel
  return out
}

function cleanChildren(children: unknown, depth: number): StoryAstNode[] {
  if (!Array.isArray(children)) return []
  const out: StoryAstNode[] = []
  for (const child of children) out.push(...cleanNode(child, depth + 1))
  return out
}

// One node in, zero or more out: an unknown wrapper gives way to its children.
function cleanNode(node: { type?: unknown, value?: unknown, tag?: unknown, props?: Record<string, unknown>, children?: unknown }, depth: number): StoryAstNode[] {
  if (!node || typeof node !== 'object') return []
  if (node.type === 'text') return typeof node.value === 'string' ? [{ type: 'text', value: node.value }] : []
  if (node.type !== 'element' || typeof node.tag !== 'string') return []
  if (depth > MAX_DEPTH) return [{ type: 'text', value: textOf(node as StoryAstElement) }]
  const tag = node.tag.toLowerCase()
  // {{ $doc.x }} reads (and calls) things in the renderer's context: show it as written.
  if (tag === 'binding') return [{ type: 'text', value: `{{ ${String(node.props?.value ?? '')} }}` }]
  if (DROPPED_WITH_CONTENT.has(tag)) return []
  const figureProps = own(FIGURE_TAGS, tag)
  if (figureProps) {
    // Figures take options only; whatever was written inside them is not shown.
    return [{ type: 'element', tag, props: cleanProps(tag, node.props ?? {}, figureProps), children: [] }]
  }
  const renamed = own(RENAMED, tag) ?? tag
  const allowed = own(TEXT_TAGS, renamed)
  const children = cleanChildren(node.children, depth)
  if (!allowed) return children
  return [{ type: 'element', tag: renamed, props: cleanProps(renamed, node.props ?? {}, allowed), children }]
}

/** The tree with only text formatting, safe links and our figures left in it. */
export function sanitizeStoryAst(root: { children?: unknown } | null | undefined): StoryAstRoot {
  return { type: 'root', children: cleanChildren(root?.children, 0) }
}

/** The figure names that appear in a tree, once each (to load only what is used). */
export function figureTagsIn(root: StoryAstRoot): string[] {
  const found = new Set<string>()
  const walk = (nodes: StoryAstNode[]) => {
    for (const n of nodes) {
      if (n.type !== 'element') continue
      if (own(FIGURE_TAGS, n.tag)) found.add(n.tag)
      walk(n.children)
    }
  }
  walk(root.children)
  return [...found]
}
