// Reading a story body's markup (Markdown with MDC figures) without rendering it:
// the figures it places with their attributes as written, and its prose with the
// markup blanked out (for the number check). Pure and small, for the reader's
// page too; the checks of a body on save are story-body.ts. Line numbers are
// 1-based lines of the body as stored.

export interface FigureUse {
  kind: 'block' | 'inline'
  name: string
  /** Attributes as written (MDC hands them to the component as strings). */
  props: Record<string, string>
  line: number
  /** The markup as written, for messages. */
  source: string
}

const BLOCK_OPEN = /^\s*(:{2,})([a-z][a-z0-9-]*)\s*(\{[^}\n]*\})?\s*$/
// An inline component: one colon, a name, braces; not part of "::" or a word ("10:30").
const INLINE = /(?<![\w:]):([a-z][a-z0-9-]*)\{([^}\n]*)\}/g
const ATTRIBUTE = /([^\s={}"']+)(?:\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s}"']+)))?/g

/** `{setups="1,2" from=2500 .wide}` -> { setups: '1,2', from: '2500' }; classes and ids are dropped. */
export function parseMdcAttributes(braces: string): Record<string, string> {
  const inner = braces.replace(/^\{/, '').replace(/\}$/, '')
  const props: Record<string, string> = {}
  for (const m of inner.matchAll(ATTRIBUTE)) {
    const key = m[1]!
    if (key.startsWith('.') || key.startsWith('#')) continue
    props[key.replace(/^:/, '')] = m[2] ?? m[3] ?? m[4] ?? 'true'
  }
  return props
}

/** Lines inside fenced code blocks are text, not figures. */
function codeFenceMask(lines: string[]): boolean[] {
  let fence: string | null = null
  return lines.map((line) => {
    const m = /^\s*(`{3,}|~{3,})/.exec(line)
    if (fence) {
      if (m && m[1]!.startsWith(fence)) fence = null
      return true
    }
    if (m) { fence = m[1]!; return true }
    return false
  })
}

/** Every figure the body places, in order. */
export function findFigures(body: string): FigureUse[] {
  const lines = body.split('\n')
  const inCode = codeFenceMask(lines)
  const found: FigureUse[] = []
  lines.forEach((line, i) => {
    if (inCode[i]) return
    const block = BLOCK_OPEN.exec(line)
    if (block) {
      found.push({ kind: 'block', name: block[2]!, props: block[3] ? parseMdcAttributes(block[3]) : {}, line: i + 1, source: line.trim() })
      return
    }
    const withoutCode = line.replace(/`[^`]*`/g, m => ' '.repeat(m.length))
    for (const m of withoutCode.matchAll(INLINE)) {
      found.push({ kind: 'inline', name: m[1]!, props: parseMdcAttributes(m[2]!), line: i + 1, source: m[0] })
    }
  })
  return found
}

// ---------- prose for the number check ----------

/**
 * The body's lines with everything that is not prose blanked to spaces (figure
 * markup, code, tags, link targets), so columns and line numbers stay where they were.
 */
export function proseLines(body: string): string[] {
  const lines = body.split('\n')
  const inCode = codeFenceMask(lines)
  const blank = (m: string) => ' '.repeat(m.length)
  return lines.map((line, i) => {
    if (inCode[i] || BLOCK_OPEN.test(line) || /^\s*:{2,}\s*$/.test(line)) return blank(line)
    return line
      .replace(/`[^`]*`/g, blank)
      .replace(INLINE, blank)
      .replace(/<[^>]*>/g, blank)
      .replace(/\]\([^)]*\)/g, m => `]${blank(m.slice(1))}`)
      .replace(/\{[^}]*\}/g, blank)
      .replace(/https?:\/\/\S+/g, blank)
  })
}
