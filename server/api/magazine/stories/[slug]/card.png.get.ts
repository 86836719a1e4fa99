// The story's social card (Open Graph and Twitter image): 1200 x 630 PNG, kept per edition.
import { z } from 'zod'
import { socialCardVersion } from '#shared/figures/social-card'
import { socialCard } from '~~/server/services/figures/social-card'
import { readerFigureStory } from '~~/server/services/figures/story-source'
import { MagazineSlugParams } from '~~/server/services/magazine/lists'

const CardQuery = z.object({ v: z.string().max(80).optional() })

export default defineEventHandler(async (event) => {
  const { slug } = await getValidatedRouterParams(event, zodParser(MagazineSlugParams))
  const { v } = await getValidatedQuery(event, zodParser(CardQuery))
  const story = await readerFigureStory(useDb(), event, slug)
  const card = await socialCard(story)
  setResponseHeaders(event, { 'content-type': 'image/png', 'etag': card.etag })
  if (!story.preview) {
    // The page links the card with its version: that address never changes its bytes.
    // Any other (no version, an old one) may show a newer card, so it is kept briefly.
    const current = v === socialCardVersion(story)
    setResponseHeader(event, 'cache-control', current ? 'public, max-age=31536000, immutable' : 'public, max-age=600')
  }
  if (getRequestHeader(event, 'if-none-match') === card.etag) {
    setResponseStatus(event, 304)
    return null
  }
  return card.png
})
