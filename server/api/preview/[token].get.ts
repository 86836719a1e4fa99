import type { StoryReaderView } from '#shared/types/stories'
import { previewTokenParam, previewView } from '~~/server/services/stories/preview'

// Public by design: whoever holds the token sees the story, and nothing else.
export default defineEventHandler(async (event): Promise<StoryReaderView> => {
  setResponseHeaders(event, { 'X-Robots-Tag': 'noindex, nofollow', 'Cache-Control': 'private, no-store', 'Referrer-Policy': 'no-referrer' })
  return previewView(useDb(), previewTokenParam(event))
})
