import type { Ref } from 'vue'
import type { ConflictField } from '#shared/utils/bench-test-draft'
import { mergeDrafts } from '#shared/utils/draft-merge'

/**
 * What a form of typed fields does when its save meets a newer version (the 409's
 * current copy goes into `theirs`): the fields changed here for the dialog, the ones
 * only the other person changed, and the two ways on. `base` is the copy the typing
 * started from; either way on makes their copy the new base and version.
 */
export function useDraftConflict<R extends { version: number }, D extends { [K in keyof D]: string }>(form: {
  draft: Ref<D>
  base: Ref<D>
  version: Ref<number>
  toDraft: (record: R) => D
  labels: Record<keyof D, string>
  /** How a value reads in the dialog, e.g. a catalog id as its label. */
  shown?: (key: keyof D, value: string) => string
}) {
  const theirs = ref(null) as Ref<R | null>
  const shown = form.shown ?? ((_key: keyof D, value: string) => value)
  const merge = computed(() => (theirs.value ? mergeDrafts(form.base.value, form.draft.value, form.toDraft(theirs.value)) : null))

  const conflictFields = computed<ConflictField[]>(() => {
    const m = merge.value
    if (!m || !theirs.value) return []
    const other = form.toDraft(theirs.value)
    return m.mine.map(k => ({ label: form.labels[k], mine: shown(k, form.draft.value[k]), theirs: shown(k, other[k]) }))
  })
  const keptFields = computed(() => (merge.value?.theirs ?? []).filter(k => !merge.value?.mine.includes(k)).map(k => form.labels[k]))

  function goOnFrom(record: R, draft: D) {
    form.draft.value = draft
    form.base.value = form.toDraft(record)
    form.version.value = record.version
  }

  /** Drops the typing for their copy; false when the dialog had nothing to resolve. */
  function takeTheirs(): boolean {
    const record = theirs.value
    theirs.value = null
    if (!record) return false
    goOnFrom(record, form.toDraft(record))
    return true
  }

  /** Puts the fields changed here over their copy, ready to be saved again. */
  function keepMine(): boolean {
    const record = theirs.value
    const m = merge.value
    theirs.value = null
    if (!record || !m) return false
    goOnFrom(record, m.merged)
    return true
  }

  return { theirs, conflictFields, keptFields, takeTheirs, keepMine }
}
