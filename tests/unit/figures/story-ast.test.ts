// The story body's second wall: whatever the parser makes of a body, only text
// formatting, safe links and our figures reach the renderer. Parsed with the real
// @nuxtjs/mdc parser, the one the pages use.
import { describe, expect, it } from 'vitest'
import { parseMarkdown } from '@nuxtjs/mdc/runtime'
import { FIGURE_TAGS, figureTagsIn, safeHref, sanitizeStoryAst, type StoryAstNode, type StoryAstRoot } from '#shared/utils/story-ast'

async function clean(md: string): Promise<StoryAstRoot> {
  const parsed = await parseMarkdown(md, { highlight: false, toc: false, contentHeading: false })
  return sanitizeStoryAst(parsed.body)
}

function elements(root: StoryAstRoot): { tag: string, props: Record<string, unknown> }[] {
  const out: { tag: string, props: Record<string, unknown> }[] = []
  const walk = (nodes: StoryAstNode[]) => nodes.forEach((n) => {
    if (n.type !== 'element') return
    out.push({ tag: n.tag, props: n.props })
    walk(n.children)
  })
  walk(root.children)
  return out
}

function text(root: StoryAstRoot): string {
  const walk = (nodes: StoryAstNode[]): string => nodes.map(n => (n.type === 'text' ? n.value : walk(n.children))).join('')
  return walk(root.children)
}

const ALLOWED = new Set(['p', 'br', 'hr', 'h2', 'h3', 'h4', 'h5', 'h6', 'strong', 'b', 'em', 'i', 'u', 's', 'del', 'ins', 'sup', 'sub', 'small', 'mark', 'abbr', 'q', 'cite', 'code', 'pre', 'kbd', 'blockquote', 'ul', 'ol', 'li', 'dl', 'dt', 'dd', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 'a', 'span', ...Object.keys(FIGURE_TAGS)])

function expectHarmless(root: StoryAstRoot) {
  for (const el of elements(root)) {
    expect(ALLOWED.has(el.tag), `tag ${el.tag}`).toBe(true)
    for (const [key, value] of Object.entries(el.props)) {
      expect(key, `attribute ${key} on ${el.tag}`).not.toMatch(/^on|^:|^v-|^@|style|srcdoc|src/i)
      expect(String(value)).not.toMatch(/javascript:|vbscript:|data:text\/html/i)
    }
  }
}

// Payloads from common practice (the usual XSS filter-evasion forms), each a
// different way into the page: a tag, an attribute, a URL scheme, MDC's own syntax.
const PAYLOADS: [string, string][] = [
  ['script tag', '<script>window.__xss = 1</script>'],
  ['img onerror', '<img src="x" onerror="window.__xss = 2">'],
  ['javascript: link in Markdown', '[click](javascript:window.__xss=3)'],
  ['javascript: link in HTML', '<a href="javascript:window.__xss=4">click</a>'],
  ['scheme hidden by an entity tab', '<a href="jav&#x09;ascript:window.__xss=5">click</a>'],
  ['svg onload', '<svg onload="window.__xss=6"><circle r="4"/></svg>'],
  ['iframe srcdoc', '<iframe srcdoc="<script>parent.__xss=7</script>"></iframe>'],
  ['MDC props with quotes', '::pull-graph{caption="a\\" onmouseover=\\"window.__xss=8" setups="1"}\n::'],
  ['MDC event binding', ':figure-value{of="peak-power" setup=1 @click="window.__xss=9"}'],
  ['MDC bound prop', '::photo{:id="$doc.constructor" id=4}\n::'],
  ['unknown global component', '::nuxt-link{to="javascript:window.__xss=10"}\nclick\n::'],
  ['data:text/html link', '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)'],
  ['object embed', '<object data="javascript:window.__xss=11"></object><embed src="x.swf">'],
  ['style attribute', '<p style="background:url(javascript:window.__xss=12)">styled</p>'],
  ['binding', '{{ $doc.updateRuntimeData }}'],
  ['form and button', '<form action="javascript:1"><button formaction="javascript:1">go</button></form>'],
]

describe('a story body cut down to what a story may contain', () => {
  it.each(PAYLOADS)('%s leaves nothing that can run', async (_name, md) => {
    const root = await clean(`Before.\n\n${md}\n\nAfter.`)
    expectHarmless(root)
    expect(text(root)).toContain('Before.')
    expect(text(root)).toContain('After.')
  })

  it('drops script, style and iframe together with what is inside them', async () => {
    const root = await clean('<script>steal()</script>\n\n<style>body{display:none}</style>\n\nText.')
    expect(text(root)).not.toMatch(/steal|display:none/)
    expect(text(root)).toContain('Text.')
  })

  it('keeps text formatting, tables and ordinary links', async () => {
    const root = await clean('## Results\n\n**Bold** and *italic*, [how we test](/how-we-test) and [a shop](https://shop.example/dyno).\n\n| rpm | hp |\n| --- | --- |\n| 5000 | 400 |')
    const tags = elements(root).map(e => e.tag)
    expect(tags).toEqual(expect.arrayContaining(['h2', 'strong', 'em', 'a', 'table', 'th', 'td']))
    const links = elements(root).filter(e => e.tag === 'a').map(e => e.props)
    expect(links).toContainEqual({ href: '/how-we-test' })
    // Outside links carry rel so they pass no referrer and no ranking (common practice).
    expect(links).toContainEqual({ href: 'https://shop.example/dyno', rel: 'nofollow noopener noreferrer' })
  })

  it('turns an h1 into an h2: the headline is the page\'s only h1', async () => {
    const root = await clean('# A heading')
    expect(elements(root).map(e => e.tag)).toEqual(['h2'])
  })

  it('keeps figures with their own options only, as text', async () => {
    const root = await clean('::pull-graph{setups="12,13" channel="power" from=2500 onclick="x()" style="x"}\n::\n\nGain :figure-value{of="peak-power-gain" setup=13 vs=12} here.')
    const figures = elements(root).filter(e => FIGURE_TAGS[e.tag])
    expect(figures).toEqual([
      { tag: 'pull-graph', props: { setups: '12,13', channel: 'power', from: '2500' } },
      { tag: 'figure-value', props: { of: 'peak-power-gain', setup: '13', vs: '12' } },
    ])
    expect(figureTagsIn(root)).toEqual(['pull-graph', 'figure-value'])
  })

  it('shows a binding as the text it was, never its value', async () => {
    const root = await clean('Value: {{ $doc.title }}')
    expect(text(root)).toContain('{{ $doc.title }}')
    expect(elements(root).map(e => e.tag)).not.toContain('binding')
  })

  it('gives an unknown component\'s text back without the component', async () => {
    const root = await clean('::fancy-box{kind="x"}\nInside the box.\n::')
    expect(elements(root).map(e => e.tag)).not.toContain('fancy-box')
    expect(text(root)).toContain('Inside the box.')
  })

  it('takes a tag named like a property of every object for an unknown one', async () => {
    const root = await clean('A <constructor>first</constructor> and\n\n::constructor\nsecond\n::')
    expect(elements(root).map(e => e.tag)).not.toContain('constructor')
    expect(text(root)).toContain('first')
    expect(text(root)).toContain('second')
    expect(figureTagsIn(sanitizeStoryAst({ children: [{ type: 'element', tag: 'hasOwnProperty', props: {}, children: [] }] }))).toEqual([])
  })

  it('survives a tree nested deeper than any story needs', () => {
    let node: StoryAstNode = { type: 'text', value: 'deep' }
    for (let i = 0; i < 500; i++) node = { type: 'element', tag: 'span', props: {}, children: [node] }
    const root = sanitizeStoryAst({ children: [node] })
    expect(text(root)).toBe('deep')
  })
})

describe('link targets', () => {
  it.each([
    ['https://example.org/a', true], ['http://example.org', true], ['mailto:desk@example.org', true],
    ['/stories/x', true], ['#results', true], ['how-we-test', true], ['./x', true],
    ['javascript:alert(1)', false], [' JaVaScRiPt:alert(1)', false], ['java\nscript:alert(1)', false],
    ['vbscript:x', false], ['data:text/html,<b>', false], ['//evil.example/x', false], ['file:///etc/passwd', false],
    // Browsers (WHATWG URL parser) read "\\" as "/" in web addresses: each of these is another site.
    ['/\\evil.example', false], ['\\\\evil.example', false], ['\\/evil.example', false], ['/\t\\evil.example', false],
    [' /\\evil.example/x', false], ['./\\x', true],
  ])('%s is %s', (href, ok) => {
    expect(safeHref(href) !== null).toBe(ok)
  })

  it('hands a followed link on with forward slashes only', () => {
    expect(safeHref('https:\\\\example.org\\a')).toBe('https://example.org/a')
  })
})
