// The reader's story page's article (StoryArticle), rendered on the server once per
// edition and reused by every later render of the page (app/utils/kept-subtree.ts).
// What the article shows is a pure function of the kept view (the published edition,
// frozen and shared by the process), the audience and the site's time zone (TimeText):
// the server always draws the story's own standard and units (the reader's choices apply
// after hydration), and the signed-in reader's header, the head and the rest of the
// payload are outside it. A preview, or figures in another standard, render afresh.
import type { NuxtApp } from '#app'
import type { StoryFigures, StoryReaderView } from '#shared/types/stories'
import type { StoryAstRoot } from '#shared/utils/story-ast'
import type { ComponentInternalInstance } from 'vue'
import StoryArticle from './StoryArticle.vue'

const nuxtAppOf = (instance: ComponentInternalInstance) => instance.appContext.app.config.globalProperties.$nuxt as NuxtApp
const SITE_ZONE_STATE = '$ssite-time-zone' // useSiteTimeZone()'s useState key, as Nuxt stores it
const on = import.meta.server && process.env.PULLSHEET_KEPT_ARTICLES !== 'off'

interface Props extends Record<string, unknown> {
  view: StoryReaderView & { preview?: boolean }
  shownFigures: StoryFigures | null | undefined
  cacheKey: string
}

export default defineKeptSubtree<Props, { key: string, data: StoryAstRoot }>({
  name: 'StoryArticleKept',
  component: StoryArticle,
  props: {
    view: { type: Object as PropType<Props['view']> },
    shownFigures: { type: null as unknown as PropType<Props['shownFigures']>, default: undefined },
    cacheKey: { type: String as PropType<string> },
  },
  enabled: () => on,
  keyOf: (props, instance) => {
    if (props.view.preview || props.shownFigures || !props.cacheKey) return null
    return { holder: props.view, key: `${props.cacheKey}\n${String(nuxtAppOf(instance).payload.state[SITE_ZONE_STATE])}` }
  },
  // The parsed body StoryBody puts in the payload (useStoryBody), so the browser does not parse it.
  capture: (props, instance) => {
    const { payload } = nuxtAppOf(instance)
    const key = storyBodyKey(props.cacheKey)
    const data = payload.data[key] as StoryAstRoot | undefined
    return data && payload._errors[key] == null ? { key, data } : null
  },
  replay: (_props, instance, { key, data }) => {
    const { payload } = nuxtAppOf(instance)
    payload._errors[key] ??= undefined
    payload.data[key] = data
  },
})
