// A line diff of two story bodies for the side-by-side revision view: the longest
// common subsequence of lines (textbook dynamic programming), after trimming the
// lines both share at the start and the end, which is most of a typical edit.
import type { DiffLine } from '../types/stories'

// Above this many cells (lines x lines) the middle is shown as removed then added.
const MAX_CELLS = 4_000_000

export function diffLines(before: string, after: string): DiffLine[] {
  const a = before.split('\n')
  const b = after.split('\n')
  let start = 0
  while (start < a.length && start < b.length && a[start] === b[start]) start++
  let endA = a.length
  let endB = b.length
  while (endA > start && endB > start && a[endA - 1] === b[endB - 1]) { endA--; endB-- }

  const head: DiffLine[] = a.slice(0, start).map(text => ({ kind: 'same', text }))
  const tail: DiffLine[] = a.slice(endA).map(text => ({ kind: 'same', text }))
  const midA = a.slice(start, endA)
  const midB = b.slice(start, endB)
  return [...head, ...diffMiddle(midA, midB), ...tail]
}

function diffMiddle(a: string[], b: string[]): DiffLine[] {
  const n = a.length
  const m = b.length
  if (n === 0 || m === 0 || (n + 1) * (m + 1) > MAX_CELLS) {
    return [...a.map(text => ({ kind: 'removed' as const, text })), ...b.map(text => ({ kind: 'added' as const, text }))]
  }
  // lcs[i][j]: length of the common subsequence of a[i..] and b[j..], flattened.
  const width = m + 1
  const lcs = new Uint32Array((n + 1) * width)
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      lcs[i * width + j] = a[i] === b[j] ? lcs[(i + 1) * width + j + 1]! + 1 : Math.max(lcs[(i + 1) * width + j]!, lcs[i * width + j + 1]!)
    }
  }
  const out: DiffLine[] = []
  let i = 0
  let j = 0
  while (i < n && j < m) {
    if (a[i] === b[j]) { out.push({ kind: 'same', text: a[i]! }); i++; j++ }
    else if (lcs[(i + 1) * width + j]! >= lcs[i * width + j + 1]!) out.push({ kind: 'removed', text: a[i++]! })
    else out.push({ kind: 'added', text: b[j++]! })
  }
  while (i < n) out.push({ kind: 'removed', text: a[i++]! })
  while (j < m) out.push({ kind: 'added', text: b[j++]! })
  return out
}
