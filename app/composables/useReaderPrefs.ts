import { ReaderPreferencesBody, type ReaderPreferences } from '#shared/types/magazine'

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
    const local = ReaderPreferencesBody.safeParse(readLocal())
    if (local.success) prefs.value = { units: local.data.units ?? null, standard: local.data.standard ?? null }
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

function readLocal(): unknown {
  try { return JSON.parse(localStorage.getItem(STORAGE_KEY) ?? 'null') ?? {} }
  catch { return {} }
}
