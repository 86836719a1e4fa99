import { sanitizeStoryAst, type StoryAstRoot } from '#shared/utils/story-ast'

/**
 * A story body as the renderer takes it: parsed by @nuxtjs/mdc (raw HTML is read
 * into elements, code is not highlighted) and then cut down to the allowlist of
 * story-ast.ts. The parser is imported only when a body is parsed: on the server,
 * and in the browser only where the text changes (the editor's preview).
 */
export async function parseStoryBody(body: string): Promise<StoryAstRoot> {
  const { parseMarkdown } = await import('@nuxtjs/mdc/runtime')
  const parsed = await parseMarkdown(body, { highlight: false, toc: false, contentHeading: false })
  return sanitizeStoryAst(parsed.body)
}

export const storyBodyKey = (key: string) => `story-body:${key}`

/** The parsed body of one story page, kept in the page's payload so the browser does not parse it again. */
export function useStoryBody(key: MaybeRefOrGetter<string>, body: MaybeRefOrGetter<string>) {
  return useAsyncData(() => storyBodyKey(toValue(key)), () => parseStoryBody(toValue(body)), {
    watch: [() => toValue(body)],
  })
}
