// One problem repeated on many lines is one problem: "torque and power disagree" on all 81
// lines of a file is said once, with the line range and the typical difference, and the
// lines themselves kept as detail for whoever wants them. Pure.
import type { Problem } from './types'

export const DISAGREEMENT_CODE = 'torque-power-disagree'
/** From this many lines of one kind on, they are summed up. */
export const GROUP_FROM_LINES = 3
/** Lines kept as detail of a summary; the summary's count says how many there were. */
export const GROUP_DETAIL_MAX = 100

/** Lines of one kind: by code, else by the same message with its figures left out, on the same column. */
function kindOf(p: Problem): string {
  return p.code ?? `${p.severity}|${p.column ?? ''}|${p.message.replace(/-?\d+(?:[.,]\d+)*/g, '#')}`
}

/** The middle value (mean of the two middle ones for an even count). */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

function summary(kind: Problem[]): Problem {
  const first = kind[0]!
  const lines = kind.map(p => p.line!)
  const rpms = kind.map(p => p.rpm).filter((r): r is number => r !== undefined)
  const values = kind.map(p => p.value).filter((v): v is number => v !== undefined)
  const firstLine = Math.min(...lines)
  const lastLine = Math.max(...lines)
  const group = {
    count: kind.length,
    firstLine,
    lastLine,
    ...(rpms.length ? { fromRpm: Math.min(...rpms), toRpm: Math.max(...rpms) } : {}),
    ...(values.length ? { typicalValue: median(values) } : {}),
  }
  const where = `${kind.length} lines (lines ${firstLine}-${lastLine}${group.fromRpm !== undefined ? `, ${group.fromRpm}-${group.toRpm} rpm` : ''})`
  const message = first.code === DISAGREEMENT_CODE && group.typicalValue !== undefined
    ? `torque and power disagree on ${where}, typically by ${group.typicalValue.toFixed(1)} %: one column was probably corrected (to a weather standard, say) and the other not`
    : `the same on ${where}, the first: ${first.message}`
  const { line: _line, value: _value, rpm: _rpm, ...rest } = first
  return { ...rest, line: firstLine, message, group, detail: kind.slice(0, GROUP_DETAIL_MAX) }
}

/**
 * Warnings of one kind on `minLines` or more lines become one summary where the first
 * of them stood; everything else keeps its place. Errors stay one per line: each must be fixed.
 */
export function groupRepeatedProblems(problems: readonly Problem[], minLines = GROUP_FROM_LINES): Problem[] {
  const kinds = new Map<string, Problem[]>()
  for (const p of problems) {
    if (p.severity !== 'warning' || p.line === undefined) continue
    const key = kindOf(p)
    const list = kinds.get(key)
    if (list) list.push(p)
    else kinds.set(key, [p])
  }
  const out: Problem[] = []
  const done = new Set<string>()
  for (const p of problems) {
    const key = p.severity === 'warning' && p.line !== undefined ? kindOf(p) : undefined
    const kind = key === undefined ? undefined : kinds.get(key)
    if (!kind || kind.length < minLines) {
      out.push(p)
      continue
    }
    if (done.has(key!)) continue
    done.add(key!)
    out.push(summary(kind))
  }
  return out
}
