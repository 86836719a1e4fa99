// Three-way merge of a form when a save meets someone else's newer version: the
// fields this writer changed keep their typed values, every other field takes
// the other person's. So "keep mine" throws away neither side's work.

export interface DraftMerge<T> {
  merged: T
  /** Changed here since the form was loaded. */
  mine: (keyof T)[]
  /** Changed by the other person since then. */
  theirs: (keyof T)[]
  /** Changed on both sides to different values: the ones to show. */
  both: (keyof T)[]
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b)
const norm = (v: unknown) => (typeof v === 'string' ? v.trim() : v)

export function mergeDrafts<T extends object>(base: T, mine: T, theirs: T): DraftMerge<T> {
  const keys = Object.keys(base) as (keyof T)[]
  const mineChanged = keys.filter(k => !same(norm(mine[k]), norm(base[k])))
  const theirsChanged = keys.filter(k => !same(norm(theirs[k]), norm(base[k])))
  const merged = { ...theirs }
  for (const k of mineChanged) merged[k] = mine[k]
  return {
    merged,
    mine: mineChanged,
    theirs: theirsChanged,
    both: mineChanged.filter(k => theirsChanged.includes(k) && !same(norm(mine[k]), norm(theirs[k]))),
  }
}
