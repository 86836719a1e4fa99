import { DEFAULT_TIME_ZONE } from '#shared/utils/time-text'

/** The magazine's time zone (site setting), as the server render put it in the payload. */
export function useSiteTimeZone() {
  return useState<string>('site-time-zone', () => DEFAULT_TIME_ZONE)
}

/** The browser's own zone, known only after mounting (the server cannot know it). */
export function useOwnTimeZone() {
  const zone = ref<string | null>(null)
  onMounted(() => {
    zone.value = Intl.DateTimeFormat().resolvedOptions().timeZone || null
  })
  return zone
}
