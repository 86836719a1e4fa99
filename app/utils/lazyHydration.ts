// Which components the browser hydrates later than the page (Nuxt's <LazyX
// hydrate-on-visible> and the like): app/plugins/lazy-hydration-preload.server.ts
// leaves their code, and that of what they render, out of the first load.

/** Whether a component type is the root of a lazily hydrated subtree (Nuxt's hydrate-* wrapper). */
export function isLazyHydrationRoot(type: unknown): boolean {
  if (!type || typeof type !== 'object') return false
  const { props, emits } = type as { props?: Record<string, unknown>, emits?: unknown }
  return Array.isArray(emits) && emits.includes('hydrated') && !!props && Object.keys(props).some(k => k.startsWith('hydrate'))
}
