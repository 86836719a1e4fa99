// Which setup a pull file belongs to is the writer's choice; nothing is assumed. Where
// the file's name or the batch's order says it plainly, a setup is proposed and the page
// says where the proposal came from, so it can be checked. Pure.

export interface SetupForProposal { id: number, label: string, position: number }
export type ProposalSource = 'file-name' | 'batch-order'
export interface SetupProposal { setupId: number | null, source: ProposalSource | null }

// Words that say nothing about which setup it is.
const COMMON = new Set(['the', 'and', 'with', 'for', 'from', 'setup', 'pull', 'pulls', 'run', 'runs', 'test', 'dyno', 'csv', 'file', 'new', 'old', 'stock', 'production', 'plus', 'into', 'out'])

const words = (text: string): string[] => text.toLowerCase().split(/[^a-z0-9]+/).filter(w => w.length >= 3 && !COMMON.has(w) && !/^\d+$/.test(w))
const stem = (w: string) => w.replace(/(es|s)$/, '')

/** "setup2", "setup-2", "s2", "cfg 2" in a file name: a setup's place in the list. */
function positionIn(name: string): number | null {
  const m = /(?:^|[^a-z])(?:setup|config|cfg|s)[\s_-]?(\d{1,2})(?![0-9])/i.exec(name)
  return m ? Number(m[1]) : null
}

/** The one setup a file name points at: its place in the list, or a word only that setup's label has. */
export function proposeFromFileName(fileName: string, setups: readonly SetupForProposal[]): number | null {
  const base = fileName.replace(/\.[a-z0-9]+$/i, '')
  const position = positionIn(base)
  if (position !== null) {
    const at = setups.filter(s => s.position === position)
    if (at.length === 1) return at[0]!.id
  }
  const nameWords = new Set(words(base).map(stem))
  const labelWords = setups.map(s => new Set(words(s.label).map(stem)))
  const matches = setups.filter((s, i) => [...labelWords[i]!].some(w => nameWords.has(w) && labelWords.every((other, j) => j === i || !other.has(w))))
  return matches.length === 1 ? matches[0]!.id : null
}

/**
 * A proposal for every file of a batch. By name when a name is plain; otherwise, when the
 * batch holds exactly one file per setup and no name said anything, by order: the files
 * sorted by name take the setups in their list order. Anything else: no proposal.
 */
export function proposeSetups(fileNames: readonly string[], setups: readonly SetupForProposal[]): SetupProposal[] {
  const byName = fileNames.map(n => proposeFromFileName(n, setups))
  if (byName.some(id => id !== null)) return byName.map(id => ({ setupId: id, source: id === null ? null : 'file-name' }))
  if (fileNames.length > 1 && fileNames.length === setups.length) {
    const ordered = [...setups].sort((a, b) => a.position - b.position)
    const sortedNames = [...fileNames].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }))
    return fileNames.map(n => ({ setupId: ordered[sortedNames.indexOf(n)]!.id, source: 'batch-order' }))
  }
  return fileNames.map(() => ({ setupId: null, source: null }))
}

export const PROPOSAL_TEXT: Record<ProposalSource, string> = {
  'file-name': 'Proposed from the file name: check it.',
  'batch-order': 'Proposed from the batch order (one file per setup, files sorted by name): check it.',
}
