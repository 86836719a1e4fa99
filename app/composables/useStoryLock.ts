import { LOCK_HEARTBEAT_SECONDS, type LockResponse, type StoryLock } from '#shared/types/stories'

/**
 * The soft lock of an open editor: taken when the editor opens, refreshed every
 * LOCK_HEARTBEAT_SECONDS while it stays open, given back when it closes. It only
 * tells others who is editing; the version check is what protects a save.
 */
export function useStoryLock(storyId: MaybeRefOrGetter<number>) {
  const lock = ref<StoryLock | null>(null)
  const heldByMe = ref(false)
  const failed = ref(false)
  let timer: ReturnType<typeof setInterval> | undefined

  async function beat(takeOver = false) {
    try {
      const res = await $fetch<LockResponse>(storyPath(toValue(storyId), '/lock'), { method: 'POST', body: takeOver ? { takeOver: true } : {} })
      lock.value = res.lock
      heldByMe.value = res.heldByMe
      failed.value = false
    }
    catch {
      // Offline for a moment: the next beat tries again; saving is not affected.
      failed.value = true
    }
  }

  function release() {
    if (!heldByMe.value) return
    // keepalive lets the request finish while the page is going away.
    fetch(storyPath(toValue(storyId), '/lock'), { method: 'DELETE', keepalive: true, credentials: 'same-origin' }).catch(() => {})
    heldByMe.value = false
  }

  onMounted(() => {
    beat()
    timer = setInterval(() => beat(), LOCK_HEARTBEAT_SECONDS * 1000)
    window.addEventListener('pagehide', release)
  })
  onBeforeUnmount(() => {
    if (timer) clearInterval(timer)
    window.removeEventListener('pagehide', release)
    release()
  })

  return { lock, heldByMe, failed, takeOver: () => beat(true) }
}
