import type { H3Event } from 'h3'
import { z, type ZodType } from 'zod'
import { rolesAtLeast } from '#shared/accounts/roles'
import type { CurrentUser } from '#shared/types/users'
import { IdSchema } from '#shared/types/workspace'
import type { BenchTestRecord } from './bench-test-core'
import { requireBenchTest } from './bench-test-access'

export const BenchTestParams = z.object({ id: IdSchema })
export const SetupParams = z.object({ id: IdSchema, setupId: IdSchema })
export const PullParams = z.object({ id: IdSchema, pullId: IdSchema })

/**
 * The start of every workspace route: a writer or above, valid route parameters, and
 * the bench test reachable by this user (404 for another writer's).
 */
export async function requireWorkspace<T extends { id: number }>(event: H3Event, params: ZodType<T>): Promise<{ user: CurrentUser, params: T, benchTest: BenchTestRecord }> {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const parsed = await getValidatedRouterParams(event, zodParser(params))
  const benchTest = await requireBenchTest(useDb(), user, parsed.id)
  return { user, params: parsed, benchTest }
}

export function sendCsvFile(event: H3Event, fileName: string, text: string): string {
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${fileName.replace(/["\\\r\n]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(fileName)}`)
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  return text
}

/** The token of an upload link from the route; anything that cannot be one is simply not found. */
export function uploadToken(event: H3Event): string {
  const token = getRouterParam(event, 'token') ?? ''
  if (!/^[\w-]{32,100}$/.test(token)) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This upload link does not exist. Ask the writer for a new one.' })
  return token
}
