// Components the browser hydrates later than the page: their code is not part of
// the page's first load (app/plugins/lazy-hydration-preload.server.ts leaves it out
// of the modulepreload links) and loads when the strategy says so. The server still
// renders them in full, so the page reads the same before they wake up.
import { defineAsyncComponent, hydrateOnVisible, type Component } from 'vue'

const LAZY_ROOT = '__pullsheetLazyHydration'

/** The component, server-rendered as usual, hydrated in the browser once it scrolls into view. */
export function hydratedWhenVisible(loader: () => Promise<Component | { default: Component }>): Component {
  const component = defineAsyncComponent({ loader, hydrate: hydrateOnVisible() })
  return Object.assign(component, { [LAZY_ROOT]: true })
}

/** Whether a component type is the root of a lazily hydrated subtree: ours, or Nuxt's hydrate-* props. */
export function isLazyHydrationRoot(type: unknown): boolean {
  if (!type || typeof type !== 'object') return false
  if ((type as Record<string, unknown>)[LAZY_ROOT]) return true
  const { props, emits } = type as { props?: Record<string, unknown>, emits?: unknown }
  return Array.isArray(emits) && emits.includes('hydrated') && !!props && Object.keys(props).some(k => k.startsWith('hydrate'))
}
