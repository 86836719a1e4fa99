// A line diff (as the revisions API sends it) laid out side by side: unchanged
// lines on both sides, a run of removed lines facing the run of added lines that
// replaced it, so a changed paragraph reads across one row.
import type { DiffLine } from '../types/stories'

export interface SideBySideCell { text: string, kind: 'same' | 'removed' | 'added', line: number }
export interface SideBySideRow { left: SideBySideCell | null, right: SideBySideCell | null }

export function sideBySide(diff: readonly DiffLine[]): SideBySideRow[] {
  const rows: SideBySideRow[] = []
  let leftLine = 0
  let rightLine = 0
  let removed: SideBySideCell[] = []
  let added: SideBySideCell[] = []
  const flush = () => {
    for (let i = 0; i < Math.max(removed.length, added.length); i++) rows.push({ left: removed[i] ?? null, right: added[i] ?? null })
    removed = []
    added = []
  }
  for (const d of diff) {
    if (d.kind === 'removed') removed.push({ text: d.text, kind: 'removed', line: ++leftLine })
    else if (d.kind === 'added') added.push({ text: d.text, kind: 'added', line: ++rightLine })
    else {
      flush()
      rows.push({ left: { text: d.text, kind: 'same', line: ++leftLine }, right: { text: d.text, kind: 'same', line: ++rightLine } })
    }
  }
  flush()
  return rows
}
