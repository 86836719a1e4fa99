// A part of a page rendered on the server once and its HTML reused by later renders.
//
// The server render of a big subtree (a story's article: ~900 elements, its figures'
// SVG, tables) is the largest share of an uncached page's CPU, yet it is a pure function
// of a kept object (the published edition's frozen view) and a few server settings. A
// component made here renders like the component it wraps; on the server it pushes the
// HTML it kept for (holder object, key) instead of rendering the subtree again, and
// replays what the subtree's render leaves behind besides HTML:
// - Vue's useId counter: ids are counted in one array shared by the components of the
//   tree up to an async boundary (`instance.ids` = [prefix, next id, next boundary]); a
//   skipped subtree advances the shared array as its render did, so the components after
//   it get the same ids as in a full render and hydrate with them.
// - the modules its components register for the page's preload links (`ssrContext.modules`),
//   in the order they registered them;
// - whatever else the caller captures (`capture`/`replay`: the payload entries).
// The kept HTML lives as long as the holder (a WeakMap), so it goes when the cache of
// views drops the edition. The browser renders the wrapped component as usual.
import { getCurrentInstance, h, type Component, type ComponentInternalInstance, type PropType } from 'vue'
import { keptRenderCounts } from '#shared/utils/kept-render-counts'

type SsrBufferItem = string | SsrBuffer | Promise<SsrBuffer>
type SsrBuffer = SsrBufferItem[] & { hasAsync?: boolean }
type SsrContext = { modules?: Set<string> } | undefined
type IdArray = [string, number, number]

export interface KeptSubtreeOptions<P extends Record<string, unknown>, E> {
  name: string
  component: Component
  /** The wrapped component's props, passed on as they are. */
  props: { [K in keyof P]: { type: PropType<P[K]> | null, default?: unknown } }
  /** What the render is keyed by, or null to render afresh (e.g. a preview, a per-reader variant). */
  keyOf: (props: P, instance: ComponentInternalInstance) => { holder: object, key: string } | null
  /** After a render has finished: what else to keep (null: the render is not kept, e.g. it failed). */
  capture?: (props: P, instance: ComponentInternalInstance) => E | null
  /** On a reuse, at the moment the subtree would have rendered: put back what `capture` kept. */
  replay?: (props: P, instance: ComponentInternalInstance, extra: E) => void
  /** Server-wide switch (tests and benchmarks): false renders every time. */
  enabled?: () => boolean
}

interface Kept<E> {
  html: string
  /** How far the render moved the shared useId array: [ids made, async boundaries]. */
  ids: [number, number]
  modules: string[]
  extra: E
}

type RenderComponent = (component: Component, props: Record<string, unknown> | null, children: null, parent: ComponentInternalInstance) => SsrBufferItem
let renderComponent: RenderComponent | undefined

/**
 * Vue's server renderer, handed in by app/plugins/kept-subtree.server.ts: imported here it
 * would come along into the browser's bundle, which never renders on the server.
 */
export function setSubtreeRenderer(render: RenderComponent): void {
  renderComponent = render
}

/** The whole string of a server render's buffer, once its async parts have resolved. It never writes to the buffer. */
export async function bufferText(buffer: SsrBufferItem): Promise<string> {
  const item = await buffer
  if (typeof item === 'string') return item
  let text = ''
  for (const part of item) text += typeof part === 'string' ? part : Array.isArray(part) && !part.hasAsync ? syncText(part) : await bufferText(part)
  return text
}

function syncText(buffer: SsrBuffer): string {
  let text = ''
  for (const part of buffer) text += typeof part === 'string' ? part : syncText(part as SsrBuffer)
  return text
}

function within(instance: ComponentInternalInstance | null, ancestor: ComponentInternalInstance): boolean {
  for (let i = instance; i; i = i.parent) if (i === ancestor) return true
  return false
}

/** Module ids registered by components under `root` from now on, in order (this render's set only). */
function recordModules(ssrContext: SsrContext, root: ComponentInternalInstance): { ids: string[], stop: () => void } | null {
  const modules = ssrContext?.modules
  if (!modules) return null
  const ids: string[] = []
  let recording = true
  const add = modules.add as (id: string) => Set<string>
  Object.defineProperty(modules, 'add', {
    configurable: true,
    value: (id: string) => {
      if (recording && within(getCurrentInstance(), root) && !ids.includes(id)) ids.push(id)
      return add.call(modules, id)
    },
  })
  return { ids, stop: () => { recording = false } }
}

export function defineKeptSubtree<P extends Record<string, unknown>, E = undefined>(options: KeptSubtreeOptions<P, E>): Component {
  const kept = new WeakMap<object, Map<string, Kept<E>>>()
  const counts = keptRenderCounts[options.name] ??= { rendered: 0, reused: 0 }
  const passOn = (props: Record<string, unknown>) => Object.fromEntries(Object.keys(options.props).map(k => [k, props[k]]))

  function ssrRender(_ctx: unknown, push: (item: SsrBufferItem) => void, instance: ComponentInternalInstance) {
    const props = instance.props as P
    const place = options.enabled?.() === false ? null : options.keyOf(props, instance)
    if (!renderComponent) throw new Error('kept subtree: the server renderer was not handed in (app/plugins/kept-subtree.server.ts)')
    const ids = (instance as unknown as { ids: IdArray }).ids // the array shared with the components around (internal to Vue)
    const ssrContext = (instance.appContext.app.config.globalProperties.$nuxt as { ssrContext?: SsrContext } | undefined)?.ssrContext
    // The ids inside the subtree start from where the shared array stands, and that depends
    // on the page around (a signed-in header counts differently): part of the key.
    const key = place && `${place.key}\n${ids[0]}:${ids[1]}:${ids[2]}`
    const found = place && kept.get(place.holder)?.get(key!)
    if (found) {
      counts.reused++
      ids[1] += found.ids[0]
      ids[2] += found.ids[1]
      const modules = ssrContext?.modules
      if (modules) for (const id of found.modules) modules.add(id)
      options.replay?.(props, instance, found.extra)
      push(found.html)
      return
    }
    counts.rendered++
    const modules = place ? recordModules(ssrContext, instance) : null
    const before = [ids[1], ids[2]]
    const rendered = renderComponent(options.component, passOn(instance.props), null, instance)
    if (!place) {
      push(rendered) // as any parent would: nothing else reads this buffer
      return
    }
    const moved: [number, number] = [ids[1] - before[0]!, ids[2] - before[1]!]
    // The page gets the subtree's text, not its buffer: Vue's renderToString overwrites the
    // items of the buffers it unrolls with strings that carry the text before them, so a
    // second reader of the same buffer would see parts of the page twice.
    const text = bufferText(rendered)
    push(text as unknown as Promise<SsrBuffer>) // a promise of a string: both of Vue's unrollers take it
    text.then((html) => {
      modules?.stop()
      const extra = options.capture ? options.capture(props, instance) : (undefined as E)
      if (extra === null) return
      let byKey = kept.get(place.holder)
      if (!byKey) kept.set(place.holder, byKey = new Map())
      byKey.set(key!, { html, ids: moved, modules: modules?.ids ?? [], extra })
    }, () => modules?.stop()) // a failed render is not kept; the page's own render reports it
  }

  return {
    name: options.name,
    props: options.props,
    // The browser's bundle leaves the server's half out.
    ssrRender: import.meta.server ? ssrRender : undefined,
    render(this: { $props: Record<string, unknown> }) {
      return h(options.component, passOn(this.$props))
    },
  } as Component
}
