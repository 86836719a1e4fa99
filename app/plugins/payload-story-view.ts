import type { MagazineStoryResponse } from '#shared/types/magazine'
import { memoOn } from '#shared/utils/object-memo'

// The published story's view is plain JSON from the API and most of a story page's
// payload. devalue gives every number of its curves an entry of its own, which was
// about a tenth of an uncached server render; as one JSON string it costs a
// JSON.stringify on the server and a JSON.parse in the browser.
const REDUCER = 'StoryView'

function isStoryView(value: unknown): value is MagazineStoryResponse {
  return typeof value === 'object' && value !== null && 'canonicalUrl' in value && 'figures' in value && 'story' in value
}

export default definePayloadPlugin(() => {
  definePayloadReducer(REDUCER, value => isStoryView(value) && memoOn(value, 'json', () => JSON.stringify(value)))
  definePayloadReviver(REDUCER, (json: string) => JSON.parse(json) as MagazineStoryResponse)
})
