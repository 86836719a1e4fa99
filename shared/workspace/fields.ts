// Building blocks of the workspace's request schemas (shared/types: bench-tests,
// build-sheets, setups, pulls, pull-imports, operator-links, inbox, analysis-results).
// Not auto-imported: the subject files import them by path.
import { z } from 'zod'

export const IsoDate = z.iso.date({ error: 'Use a date like 2026-05-14' })
export const text = (max: number, label = 'this') => z.string().trim().max(max, `Keep ${label} under ${max} characters`)
export const positive = (label: string, max: number) => z.number({ error: `Enter ${label} as a number` }).positive(`${label} must be above 0`).max(max, `${label} above ${max} is not plausible`)
/** The ids of an id/label list, as z.enum wants them. */
export const ids = <T extends readonly { id: string }[]>(list: T) => list.map(i => i.id) as [T[number]['id'], ...T[number]['id'][]]
/** The refinement of a pull file whose weather may be null only when the dyno already corrected it. */
export const weatherUnlessCorrected = { message: 'Enter the weather of the pull (or mark it as corrected by the dyno)', path: ['weather'] }
