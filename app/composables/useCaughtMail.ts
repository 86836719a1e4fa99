export interface CaughtMessage {
  id: string
  receivedAt: string
  to: string[]
  subject: string
  text: string
}

export const caughtMailKey = () => 'dev-mail'

/** Messages the local mail catcher holds (demo and development only: 404 elsewhere). */
export function useCaughtMail() {
  return useFetch<{ messages: CaughtMessage[] }>('/api/dev/mail', { key: caughtMailKey() })
}
