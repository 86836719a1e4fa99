// Results worked out from an object that never changes in place, kept beside it
// for as long as the object lives. On the server a published story's view is one
// kept, frozen object shared by every render (server/services/magazine/story.ts), so
// what the page derives from it is worked out once per story version instead of
// once per page; in the browser each fetched view simply gets its own.
const memos = new WeakMap<object, Map<string, unknown>>()

/** `compute()`'s result for (owner, key); `key` must name everything else it reads. */
export function memoOn<T>(owner: object, key: string, compute: () => T): T {
  let kept = memos.get(owner)
  if (!kept) memos.set(owner, (kept = new Map()))
  if (kept.has(key)) return kept.get(key) as T
  const value = compute()
  kept.set(key, value)
  return value
}
