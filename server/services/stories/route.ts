import type { H3Event } from 'h3'
import { z, type ZodType } from 'zod'
import { rolesAtLeast } from '#shared/accounts/roles'
import type { CurrentUser } from '#shared/types/users'

const Id = z.coerce.number().int().positive()
export const StoryParams = z.object({ id: Id })
export const StoryRevisionParams = z.object({ id: Id, revisionId: Id })
export const StoryNoteParams = z.object({ id: Id, noteId: Id })
export const StoryLinkParams = z.object({ id: Id, linkId: Id })

/** The start of every story route: a writer or above and valid route parameters (the story itself is checked by the service). */
export async function requireStoryRoute<T extends { id: number }>(event: H3Event, params: ZodType<T> = StoryParams as unknown as ZodType<T>): Promise<{ user: CurrentUser, params: T }> {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  return { user, params: await getValidatedRouterParams(event, zodParser(params)) }
}
