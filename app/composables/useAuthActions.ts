import type { z } from 'zod'
import type { LoginBody, RegisterBody } from '#shared/types/users'
import { currentUserKey } from './useCurrentUser'
import { safeNext } from '~/utils/safeNext'

export function useAuthActions() {
  async function login(body: z.input<typeof LoginBody>, next?: unknown) {
    await $fetch('/api/auth/login', { method: 'POST', body })
    await refreshNuxtData(currentUserKey())
    await navigateTo(safeNext(next))
  }

  /** Nothing is signed in: the account is finished from the link in the mail. */
  async function register(body: z.input<typeof RegisterBody>) {
    await $fetch('/api/auth/register', { method: 'POST', body })
  }

  async function logout() {
    try {
      await $fetch('/api/auth/logout', { method: 'POST' })
    }
    finally {
      // Cached answers of the last user (user lists, drafts) must not outlive the
      // session on a shared browser.
      clearNuxtData(key => key !== currentUserKey())
      await refreshNuxtData(currentUserKey())
      await navigateTo('/')
    }
  }

  return { login, register, logout }
}
