import { rolesAtLeast } from '#shared/accounts/roles'
import { ReaderPreferencesBody } from '#shared/types/magazine'
import { saveReaderPreferences } from '~~/server/services/magazine/preferences'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('reader'))
  const body = await readValidatedBody(event, zodParser(ReaderPreferencesBody))
  return { preferences: await saveReaderPreferences(useDb(), user.id, body) }
})
