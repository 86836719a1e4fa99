// A component hydrated lazily (Nuxt's <LazyX hydrate-on-visible> and the like) should
// not have its code in the page's first load. Nuxt 4.4.5 means to leave such a component's module out of the
// modulepreload links, but does it too late (nuxt/nuxt#35145, fixed upstream by
// #35342: the module list had already been read, and cached, for the stylesheets),
// and it never leaves out the components rendered inside it.
//
// So the render's module list is watched here: each module is registered from the
// setup of a component instance, and a module all of whose instances sit inside a
// lazily hydrated component is not yielded when the renderer reads the list for its
// links. The cost: such modules' own stylesheets are left out too. Ours have none
// (components style with Tailwind classes in the entry CSS); a lazily hydrated
// component with a <style> block would need this looked at again. Remove this plugin's
// first half when Nuxt carries the fix.
import { getCurrentInstance, type ComponentInternalInstance } from 'vue'

function insideLazyHydration(instance: ComponentInternalInstance | null): boolean {
  for (let i = instance; i; i = i.parent) if (isLazyHydrationRoot(i.type)) return true
  return false
}

export default defineNuxtPlugin((nuxtApp) => {
  const ssrContext = nuxtApp.ssrContext as (typeof nuxtApp.ssrContext & { modules?: Set<string> }) | undefined
  const modules = ssrContext?.modules
  if (!modules) return
  // Module id -> whether every instance registered so far was inside a lazily hydrated component.
  const onlyInsideLazy = new Map<string, boolean>()
  const add = modules.add.bind(modules)
  const all = modules.values.bind(modules)
  Object.defineProperty(modules, 'add', {
    configurable: true,
    value: (id: string) => {
      onlyInsideLazy.set(id, (onlyInsideLazy.get(id) ?? true) && insideLazyHydration(getCurrentInstance()))
      return add(id)
    },
  })
  // for...of (how the renderer reads the list) goes through Symbol.iterator; values() does not.
  Object.defineProperty(modules, Symbol.iterator, {
    configurable: true,
    value: function* () {
      const lazy = ssrContext['~lazyHydratedModules']
      for (const id of all()) if (!lazy?.has(id) && !onlyInsideLazy.get(id)) yield id
    },
  })
})
