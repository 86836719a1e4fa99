import { SiteSettingsPatchBody } from '#shared/types/site-settings'
import { updateSiteSettings } from '~~/server/services/magazine/settings'

// Changes some of the magazine's settings; the version read guards against a colleague's change.
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const body = await readValidatedBody(event, zodParser(SiteSettingsPatchBody))
  return updateSiteSettings(useDb(), admin.id, body)
})
