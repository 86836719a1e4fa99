import type { ReaderPreferences } from '#shared/types/magazine'
import { ANALYSIS_UNITS } from '#shared/types/analysis'
import { CORRECTION_STANDARD_IDS } from '#shared/dyno/correction'

const STORAGE_KEY = 'pullsheet:reader-prefs'
export const readerPrefsKey = () => 'reader-prefs'

/**
 * Units and correction standard the reader chose for graphs and tables. Anonymous
 * readers keep them in localStorage; signed-in readers on their account too. They
 * are read in the browser only, so the server-rendered page (which caches) is the
 * same for everyone and switches after hydration.
 */
export function useReaderPrefs() {
  const prefs = useState<ReaderPreferences>(readerPrefsKey(), () => ({ units: null, standard: null }))
  const loaded = useState<boolean>('reader-prefs-loaded', () => false)
  const { signedIn } = useCurrentUser()

  async function load() {
    if (import.meta.server || loaded.value) return
    loaded.value = true
    prefs.value = readLocal()
    if (!signedIn.value) return
    try {
      const res = await $fetch<{ preferences: ReaderPreferences }>('/api/preferences')
      prefs.value = res.preferences
    }
    catch {
      // Keep the browser's copy; the account's comes back with the next page.
    }
  }

  async function save(next: Partial<ReaderPreferences>) {
    prefs.value = { ...prefs.value, ...next }
    try { localStorage.setItem(STORAGE_KEY, JSON.stringify(prefs.value)) }
    catch { /* private mode: the choice lasts for this page */ }
    if (signedIn.value) await $fetch('/api/preferences', { method: 'PATCH', body: next }).catch(() => {})
  }

  return { prefs, load, save }
}

// By hand, not with the PATCH body's zod schema: zod would then be part of every
// story page's first-load JavaScript. Anything not a current choice counts as none.
function readLocal(): ReaderPreferences {
  let kept: Record<string, unknown> = {}
  try { kept = JSON.parse(localStorage.getItem(STORAGE_KEY) ?? 'null') ?? {} }
  catch { /* unreadable: nothing kept */ }
  return {
    units: ANALYSIS_UNITS.find(u => u.id === kept.units)?.id ?? null,
    standard: CORRECTION_STANDARD_IDS.find(id => id === kept.standard) ?? null,
  }
}
