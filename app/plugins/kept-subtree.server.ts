// Hands Vue's server renderer to the kept subtrees (app/utils/kept-subtree.ts) once per
// process; the browser's bundle never imports it.
import { ssrRenderComponent } from 'vue/server-renderer'
import { setSubtreeRenderer } from '~/utils/kept-subtree'

setSubtreeRenderer(ssrRenderComponent as Parameters<typeof setSubtreeRenderer>[0])

export default defineNuxtPlugin({ name: 'kept-subtree', setup: () => {} })
