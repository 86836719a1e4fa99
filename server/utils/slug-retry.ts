/** A unique-key clash on a slug, or the deadlock two inserts into one unique index can cause. */
function slugRace(error: unknown): boolean {
  const e = error as { code?: string, message?: string }
  return (e.code === 'ER_DUP_ENTRY' && /slug/i.test(e.message ?? '')) || e.code === 'ER_LOCK_DEADLOCK'
}

const MAX_ATTEMPTS = 25

/**
 * Runs an insert that picks the next free slug, again when a parallel insert took the
 * same slug first: each try reads the slugs taken by then, after a short random wait
 * so that the racers do not meet again on the next one.
 */
export async function withFreeSlug<T>(insert: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await insert()
    }
    catch (error) {
      if (!slugRace(error) || attempt >= MAX_ATTEMPTS) throw error
      await new Promise(resolve => setTimeout(resolve, Math.random() * 10 * Math.min(attempt, 5)))
    }
  }
}
