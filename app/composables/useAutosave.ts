import { UpdateStoryBody, type Story } from '#shared/types/stories'
import {
  DRAFT_FIELDS, changedFields, copyDiffers, draftCopyKey, draftOf, parseDraftCopy, patchBody,
  type StoredDraftCopy, type StoryDraft,
} from '#shared/utils/story-draft'
import { apiMessage, apiStatus } from '~/utils/apiErrors'

export type SaveState = 'saved' | 'dirty' | 'saving' | 'offline' | 'conflict' | 'invalid' | 'readonly' | 'error'

/** Quiet typing this long sends an autosave. */
export const AUTOSAVE_DELAY_MS = 1500
/** After a failed send, try again this soon (or at the next keystroke). */
const RETRY_MS = 10_000

function readCopy(storyId: number): StoredDraftCopy | null {
  try {
    return parseDraftCopy(localStorage.getItem(draftCopyKey(storyId)), storyId)
  }
  catch {
    return null
  }
}

/**
 * The editor's draft and its saving: autosave while typing (debounced), explicit
 * saves, every save carrying the version it is based on. Nothing typed is lost:
 * a save the network drops leaves a copy in this browser (offered back on the next
 * visit), a stale save opens the conflict with the newer story, and the draft is
 * never replaced behind the writer's back.
 */
export function useStoryAutosave(initial: Story, onSaved: (story: Story) => void) {
  const storyId = initial.id
  const { save } = useStoryActions(storyId)
  const fieldErrors = useFieldErrors()

  const draft = reactive<StoryDraft>(draftOf(initial))
  const saved = shallowRef<StoryDraft>(draftOf(initial))
  const baseVersion = ref(initial.version)
  const state = ref<SaveState>(initial.mayEdit ? 'saved' : 'readonly')
  const message = ref('')
  const lastSavedAt = ref<string | null>(null)
  const conflict = shallowRef<Story | null>(null)
  const offeredCopy = shallowRef<StoredDraftCopy | null>(null)

  const pending = computed(() => changedFields(draft, saved.value))
  let timer: ReturnType<typeof setTimeout> | undefined
  let running: Promise<boolean> | null = null

  function keepCopy() {
    try {
      const copy: StoredDraftCopy = { storyId, baseVersion: baseVersion.value, savedAt: new Date().toISOString(), draft: JSON.parse(JSON.stringify(draft)) }
      localStorage.setItem(draftCopyKey(storyId), JSON.stringify(copy))
    }
    catch {
      // Storage full or blocked: the text is still in the page.
    }
  }
  function dropCopy() {
    try { localStorage.removeItem(draftCopyKey(storyId)) }
    catch { /* nothing kept */ }
  }

  function schedule(ms = AUTOSAVE_DELAY_MS) {
    clearTimeout(timer)
    timer = setTimeout(() => { void saveNow(true) }, ms)
  }

  async function send(autosave: boolean): Promise<boolean> {
    if (state.value === 'readonly' || conflict.value) return false
    const fields = pending.value
    if (autosave && !fields.length) return true
    const body = patchBody(draft, fields, baseVersion.value, autosave)
    const checked = fieldErrors.check(UpdateStoryBody, body)
    if (!checked) {
      state.value = 'invalid'
      message.value = 'Not saved yet: fix the marked fields.'
      return false
    }
    const sent: StoryDraft = JSON.parse(JSON.stringify(draft))
    state.value = 'saving'
    try {
      const story = await save(checked)
      baseVersion.value = story.version
      saved.value = sent
      lastSavedAt.value = story.updatedAt
      dropCopy()
      state.value = changedFields(draft, sent).length ? 'dirty' : 'saved'
      message.value = ''
      onSaved(story)
      if (state.value === 'dirty') schedule()
      return true
    }
    catch (err) {
      const status = apiStatus(err)
      const stale = staleVersionOf<Story>(err)
      if (stale) {
        conflict.value = stale.current
        state.value = 'conflict'
        message.value = 'Someone else saved this story meanwhile.'
      }
      else if (status === 409) {
        state.value = 'readonly'
        message.value = apiMessage(err, 'This story cannot be changed in its state.')
      }
      else if (status === 400) {
        fieldErrors.fromApi(err)
        state.value = 'invalid'
        message.value = apiMessage(err, 'Not saved yet: fix the marked fields.')
      }
      else if (status === undefined || status >= 500) {
        // The network or the server is away: keep the text here and try again.
        keepCopy()
        state.value = 'offline'
        message.value = 'Not saved: the server cannot be reached. A copy is kept in this browser.'
        schedule(RETRY_MS)
      }
      else {
        state.value = 'error'
        message.value = apiMessage(err, 'The story could not be saved.')
      }
      return false
    }
  }

  /** One save at a time, in order: the second waits for the first's new version. */
  async function saveNow(autosave: boolean): Promise<boolean> {
    clearTimeout(timer)
    while (running) await running
    running = send(autosave)
    try {
      return await running
    }
    finally {
      running = null
    }
  }

  watch(draft, () => {
    if (state.value === 'readonly' || conflict.value) return
    if (pending.value.length) {
      if (state.value !== 'saving' && state.value !== 'offline') state.value = 'dirty'
      schedule()
    }
  }, { deep: true })

  function replaceDraft(content: StoryDraft) {
    Object.assign(draft, JSON.parse(JSON.stringify(content)))
  }

  // ---------- the conflict dialog: nothing is lost whichever way ----------

  /**
   * Keep mine: what I changed goes over the newer version; what only they changed
   * stays theirs (it would otherwise be undone without anyone deciding to).
   */
  async function keepMine() {
    const current = conflict.value
    if (!current) return false
    const mine = changedFields(draft, saved.value)
    const theirs = draftOf(current)
    for (const f of DRAFT_FIELDS) {
      if (!mine.includes(f)) (draft as Record<string, unknown>)[f] = JSON.parse(JSON.stringify(theirs[f]))
    }
    baseVersion.value = current.version
    saved.value = theirs
    conflict.value = null
    state.value = 'dirty'
    return saveNow(false)
  }

  /** Take theirs: the newer story replaces the draft (after copying mine aside, if asked). */
  function takeTheirs() {
    const current = conflict.value
    if (!current) return
    baseVersion.value = current.version
    saved.value = draftOf(current)
    replaceDraft(draftOf(current))
    conflict.value = null
    state.value = 'saved'
    message.value = ''
    onSaved(current)
  }

  // ---------- the copy left by a save that never arrived ----------

  onMounted(() => {
    const copy = readCopy(storyId)
    if (copy && copyDiffers(copy, initial)) offeredCopy.value = copy
    else if (copy) dropCopy()
    window.addEventListener('beforeunload', onLeave)
  })
  onBeforeUnmount(() => {
    clearTimeout(timer)
    window.removeEventListener('beforeunload', onLeave)
  })
  function onLeave(e: BeforeUnloadEvent) {
    if (!pending.value.length || state.value === 'readonly') return
    keepCopy()
    e.preventDefault()
  }

  /** Puts the kept copy into the editor; it saves against the story's current version. */
  function restoreCopy() {
    const copy = offeredCopy.value
    if (!copy) return
    replaceDraft(copy.draft)
    offeredCopy.value = null
  }
  function discardCopy() {
    offeredCopy.value = null
    dropCopy()
  }

  return {
    draft, saved, baseVersion, state, message, lastSavedAt, pending, conflict, offeredCopy,
    errors: fieldErrors.errors, saveNow, keepMine, takeTheirs, restoreCopy, discardCopy, replaceDraft,
    /** After a restore or a change of state elsewhere: the story as the server now has it. */
    adopt(story: Story) {
      baseVersion.value = story.version
      saved.value = draftOf(story)
      replaceDraft(draftOf(story))
      state.value = story.mayEdit ? 'saved' : 'readonly'
      conflict.value = null
    },
  }
}
