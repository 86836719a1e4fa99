import { ResetConfirmBody } from '#shared/types/users'

export default defineEventHandler(async (event) => {
  const { token, password } = await readValidatedBody(event, zodParser(ResetConfirmBody))
  await redeemUserToken(token, password)
  return { ok: true }
})
