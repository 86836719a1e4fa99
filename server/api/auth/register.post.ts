import { RegisterBody } from '#shared/types/users'

/** Readers sign themselves up; other roles are given by an admin. */
export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, zodParser(RegisterBody))
  const user = await createUser({ ...body, role: 'reader' })
  const sv = (await findUserByEmail(user.email))!.session_version
  await replaceUserSession(event, { user: { id: user.id, sv }, loggedInAt: new Date().toISOString() })
  return { user: { id: user.id, email: user.email, displayName: user.displayName, role: user.role } }
})
