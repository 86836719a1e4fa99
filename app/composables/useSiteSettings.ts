import type { SiteSettingsView } from '#shared/types/site-settings'

export const siteSettingsKey = () => 'admin-site-settings'

/** The admin's view of the magazine's settings, with the version a change must send back. */
export function useAdminSiteSettings() {
  return useFetch<SiteSettingsView>('/api/admin/settings', { key: siteSettingsKey() })
}
