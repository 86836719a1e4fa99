// The check of a batch of pull files before it is saved, as plain data: the import
// route runs it in the check pool (server/pull-worker/), the inbox and the seed call it
// through checkPullBatch (server/services/workspace/pull-import.ts). Pure: no h3, no database.
import type { CorrectionStandard } from '../../../shared/dyno/index'
import type { ImportRefusedData } from '../../../shared/types/pull-imports'
import type { ImportProblem } from '../../../shared/types/pulls'
import { capProblems, checkPullFile, weatherProblems } from './pull-check'
import type { CheckedPull, PullToImport } from './pull-import'

export type PullBatchCheck
  = | { ok: true, pulls: CheckedPull[] }
    | { ok: false, message: string, data: ImportRefusedData }

/** Every file checked; any error refuses the batch, with a message naming the first error's file, line and column. */
export function checkPullBatchFiles(files: readonly PullToImport[], standard: CorrectionStandard): PullBatchCheck {
  const checked = files.map((input) => {
    const file = checkPullFile({ name: input.name, text: input.text, bytes: input.bytes, mapping: input.mapping })
    file.preview.problems.push(...weatherProblems(input.name, input.weather, input.dynoCorrected === true, standard))
    file.preview.ok = !file.preview.problems.some(p => p.severity === 'error')
    return file
  })
  const errors: ImportProblem[] = checked.flatMap(c => c.preview.problems.filter(p => p.severity === 'error'))
  if (errors.length) {
    const refusedFiles = new Set(errors.map(e => e.file)).size
    const message = `Nothing was saved: ${refusedFiles} of ${files.length} file${files.length === 1 ? '' : 's'} ${refusedFiles === 1 ? 'has' : 'have'} errors. ${errors[0]!.text}${errors.length > 1 ? ` (and ${errors.length - 1} more)` : ''}`
    return { ok: false, message, data: { files: checked.map(c => c.preview), problems: errors } }
  }
  return {
    ok: true,
    pulls: checked.map((c, i) => ({
      input: files[i]!,
      checked: c,
      problems: capProblems(c.preview.problems.filter(p => p.severity !== 'error').map(({ severity, line, column, message }) => ({ severity, ...(line === undefined ? {} : { line }), ...(column ? { column } : {}), message }))),
    })),
  }
}
