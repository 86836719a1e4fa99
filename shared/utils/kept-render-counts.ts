/**
 * Server renders of a kept subtree made and reused (app/utils/kept-subtree.ts), by the
 * wrapper's name: GET /api/admin/runtime reports them. The Vue app and the Nitro server
 * are bundled apart, each with its own copy of this module, so the one record lives on
 * globalThis for both to see.
 */
export type KeptRenderCounts = Record<string, { rendered: number, reused: number }>

const holder = globalThis as { __pullsheetKeptRenders?: KeptRenderCounts }

export const keptRenderCounts: KeptRenderCounts = holder.__pullsheetKeptRenders ??= {}
