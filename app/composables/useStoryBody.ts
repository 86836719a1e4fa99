import type { StoryAstRoot } from '#shared/utils/story-ast'
import { LruCache } from '#shared/utils/lru-cache'

/**
 * A story body as the renderer takes it: parsed by @nuxtjs/mdc (raw HTML is read
 * into elements, code is not highlighted) and then cut down to the allowlist of
 * story-ast.ts. The parser and the allowlist are imported only when a body is
 * parsed: on the server, and in the browser only where the text changes (the
 * editor's preview); a story page gets the tree in its payload.
 */
export async function parseStoryBody(body: string): Promise<StoryAstRoot> {
  // Parsing costs milliseconds per render and a published body is read by every
  // uncached page: the server keeps recent parses, keyed by the text itself. The
  // renderer only reads the tree, so one copy serves every request.
  const kept = import.meta.server ? parsedBodies.get(body) : undefined
  if (kept) return kept
  const [{ parseMarkdown }, { sanitizeStoryAst }] = await Promise.all([import('@nuxtjs/mdc/runtime'), import('#shared/utils/story-ast')])
  const parsed = await parseMarkdown(body, { highlight: false, toc: false, contentHeading: false })
  const ast = sanitizeStoryAst(parsed.body)
  if (import.meta.server) parsedBodies.set(body, ast)
  return ast
}

// The hundred most recently read bodies: a few megabytes at most.
const parsedBodies = new LruCache<StoryAstRoot>(100)

export const storyBodyKey = (key: string) => `story-body:${key}`

/** The parsed body of one story page, kept in the page's payload so the browser does not parse it again. */
export function useStoryBody(key: MaybeRefOrGetter<string>, body: MaybeRefOrGetter<string>) {
  return useAsyncData(() => storyBodyKey(toValue(key)), () => parseStoryBody(toValue(body)), {
    watch: [() => toValue(body)],
  })
}
