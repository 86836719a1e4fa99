// The magazine's settings: read often (every time shown, every print export), changed
// rarely by an admin. Each key is a row; missing or unreadable rows fall back to defaults.
import type { Db } from '../../utils/db'
import { DEFAULT_SITE_SETTINGS, SiteSettingsSchema, type SiteSettingKey, type SiteSettings, type SiteSettingsPatch, type SiteSettingsView } from '#shared/types/site-settings'

interface SettingRow { key: string, value: string, version: number, updated_at: Date | string, updated_by_name: string | null }

// Brief, so another app server picks up an admin's change within seconds (the other
// processes of this host drop theirs at once: server/utils/sibling-processes.ts).
const CACHE_MS = 5_000
let cached: { view: SiteSettingsView, at: number } | undefined
onSiblingDrop('site-settings', () => { cached = undefined })

const KEYS = Object.keys(SiteSettingsSchema.shape) as SiteSettingKey[]

function parseValue<K extends SiteSettingKey>(key: K, raw: string): SiteSettings[K] {
  try {
    const parsed = SiteSettingsSchema.shape[key].safeParse(JSON.parse(raw))
    // A stored value that no longer passes (a rule tightened later) reads as the default.
    if (parsed.success) return parsed.data as SiteSettings[K]
  }
  catch { /* not JSON: the default below */ }
  return DEFAULT_SITE_SETTINGS[key]
}

async function readRows(db: Db, lock = false): Promise<SettingRow[]> {
  const query = db('site_settings as s').leftJoin('users as u', 'u.id', 's.updated_by')
    .select('s.key', 's.value', 's.version', 's.updated_at', 'u.display_name as updated_by_name')
  return (lock ? query.forUpdate() : query) as Promise<SettingRow[]>
}

// The sum of the rows' versions rises by one with every change to any key (a new row
// starts at 1), so one number stands for "the settings as I read them".
function toView(rows: SettingRow[]): SiteSettingsView {
  const settings: Record<string, unknown> = { ...DEFAULT_SITE_SETTINGS }
  let version = 0
  let latest: SettingRow | undefined
  for (const row of rows) {
    version += Number(row.version)
    if (!latest || new Date(row.updated_at) > new Date(latest.updated_at)) latest = row
    if ((KEYS as string[]).includes(row.key)) settings[row.key] = parseValue(row.key as SiteSettingKey, row.value)
  }
  return {
    settings: settings as SiteSettings,
    version,
    updatedAt: latest ? new Date(latest.updated_at).toISOString() : null,
    updatedByName: latest?.updated_by_name ?? null,
  }
}

/** Settings, version and who changed them last (the admin page). */
export async function getSiteSettingsView(db: Db): Promise<SiteSettingsView> {
  if (cached && Date.now() - cached.at < CACHE_MS) return cached.view
  const view = toView(await readRows(db))
  cached = { view, at: Date.now() }
  return view
}

/** The magazine's settings with defaults filled in; cached for a few seconds per process. */
export async function getSiteSettings(db: Db): Promise<SiteSettings> {
  return (await getSiteSettingsView(db)).settings
}

/** Changes some settings if nobody changed any since `version` was read; 409 otherwise. */
export async function updateSiteSettings(db: Db, actorId: number, patch: SiteSettingsPatch): Promise<SiteSettingsView> {
  const { version, ...changes } = patch
  const keys = KEYS.filter(k => changes[k] !== undefined)
  let saved: SiteSettingsView
  try {
    saved = await db.transaction(async (trx) => {
      const current = toView(await readRows(trx, true))
      if (current.version !== version) {
        throw httpError(409, `The settings were changed by ${current.updatedByName ?? 'someone else'} meanwhile. Reload them and make your change again.`, { currentVersion: current.version, current })
      }
      for (const key of keys) {
        await trx('site_settings')
          .insert({ key, value: JSON.stringify(changes[key]), version: 1, updated_by: actorId })
          .onConflict('key').merge({ value: JSON.stringify(changes[key]), version: trx.raw('version + 1'), updated_by: actorId })
      }
      return toView(await readRows(trx))
    })
  }
  catch (error) {
    // Two first-ever saves of one key at once: the loser sees the other's new row.
    if (isDuplicateEntry(error)) throw httpError(409, 'The settings were changed by someone else meanwhile. Reload them and make your change again.')
    throw error
  }
  cached = { view: saved, at: Date.now() }
  await dropInSiblings('site-settings')
  return saved
}
