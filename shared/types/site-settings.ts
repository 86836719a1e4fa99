import { z } from 'zod'
import { DEFAULT_TIME_ZONE } from '../utils/time-text'
import { isKnownTimeZone } from '../settings/time-zone'

export const TimeZoneSchema = z.string().trim().min(1, 'Enter a time zone').max(64)
  .refine(isKnownTimeZone, 'Use a time zone name such as America/Chicago or Europe/Berlin')

const columnMm = (what: string) => z.number({ error: `Enter the ${what} width in millimetres` })
  .min(20, 'At least 20 mm').max(400, 'At most 400 mm')

/** Widths of the printed page's column spans, for print exports at their printed size. */
export const PrintColumnsMmSchema = z.object({ one: columnMm('one-column'), two: columnMm('two-column'), three: columnMm('three-column') })
  .refine(c => c.one < c.two && c.two < c.three, { error: 'Each span must be wider than the one before', path: ['three'] })

export const SiteSettingsSchema = z.object({
  /** The magazine's time zone: every time on every page and in every e-mail is said in it. */
  timeZone: TimeZoneSchema,
  printColumnsMm: PrintColumnsMmSchema,
})

export type SiteSettings = z.infer<typeof SiteSettingsSchema>
export type SiteSettingKey = keyof SiteSettings

export const DEFAULT_SITE_SETTINGS: SiteSettings = Object.freeze({
  timeZone: DEFAULT_TIME_ZONE,
  printColumnsMm: Object.freeze({ one: 55, two: 115, three: 175 }),
}) as SiteSettings

/**
 * PATCH /api/admin/settings: only the settings that change, and the version read with them
 * (a change made meanwhile by another admin answers 409 instead of being overwritten).
 */
export const SiteSettingsPatchBody = SiteSettingsSchema.partial().extend({ version: z.number().int().min(0) })
export type SiteSettingsPatch = z.infer<typeof SiteSettingsPatchBody>

/** GET and PATCH /api/admin/settings. */
export interface SiteSettingsView {
  settings: SiteSettings
  /** Rises with every change to any setting; send it back with a change. */
  version: number
  updatedAt: string | null
  updatedByName: string | null
}
