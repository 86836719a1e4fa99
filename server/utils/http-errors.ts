// HTTP errors of the workspace services. Imported explicitly from h3 (not Nitro's
// auto-imports) because the demo seed runs these services under plain tsx.
import { createError } from 'h3'
import type { DeleteConfirmData, StaleVersionData } from '../../shared/types/workspace'

export function httpError(statusCode: number, message: string, data?: unknown): Error {
  const statusMessage = STATUS_TEXT[statusCode] ?? 'Error'
  return createError({ statusCode, statusMessage, message, ...(data === undefined ? {} : { data }) })
}

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request', 404: 'Not Found', 409: 'Conflict', 410: 'Gone', 413: 'Content Too Large', 415: 'Unsupported Media Type', 422: 'Unprocessable Content', 429: 'Too Many Requests', 503: 'Service Unavailable',
}

export function missing(what: string): never {
  throw httpError(404, what)
}

/** 400 in the same shape zodParser gives, for rules a schema cannot see (a setup of another bench test...). */
export function invalidField(path: string, message: string): never {
  throw httpError(400, message, { issues: [{ path, message }] })
}

/** 409 when the version the client read is no longer the current one; it gets the row as it is now. */
export function staleVersion<T extends { version: number }>(current: T, what: string): never {
  const data: StaleVersionData<T> = { currentVersion: current.version, current }
  throw httpError(409, `This ${what} was changed by someone else meanwhile (now version ${current.version}). Reload it and make your change again.`, data)
}

/** 409 asking for ?confirm=true before pulls go with what is deleted. */
export function confirmDeletion(what: string, setups: number, pulls: number): never {
  const message = `Deleting this ${what} also takes ${pulls} pull${pulls === 1 ? '' : 's'}${setups ? ` in ${setups} setup${setups === 1 ? '' : 's'}` : ''} out of the workspace. Confirm to delete it (it can be restored).`
  const data: DeleteConfirmData = { setups, pulls, message }
  throw httpError(409, message, data)
}
