import { proposeSetups, type ProposalSource, type SetupForProposal } from '#shared/utils/setup-proposal'
import { parsePullCsv, type ColumnRole, type Problem } from '#shared/dyno'
import { CommitPullsBody, type CommitPullsResponse, type ImportRefusedData, type PreviewPullsResponse, type PullFilePreview } from '#shared/types/pull-imports'
import { PULL_LIMITS } from '#shared/types/workspace'
import { formNumber } from '#shared/utils/form-values'
import { withColumnRole } from '#shared/utils/pull-columns'
import { apiFieldIssues, apiMessage, apiStatus } from '~/utils/apiErrors'

export type WeatherDraft = { baroInHg: string, airTempF: string, humidityPct: string }

/** The browser's own first look at a file, before the server's check answers. */
export interface LocalPreview {
  pointCount: number
  rpmFrom: number | null
  rpmTo: number | null
  units: PullFilePreview['units']
  weather: PullFilePreview['weather']
  problems: Problem[]
  unrecognisedHeaders: string[]
  ok: boolean
}

export interface ImportEntry {
  key: string
  name: string
  sizeBytes: number
  text: string | null
  readFraction: number
  uploadFraction: number
  stage: 'reading' | 'checking' | 'ready' | 'failed'
  local: LocalPreview | null
  preview: PullFilePreview | null
  mapping: Record<string, ColumnRole>
  setupId: number | null
  /** Where a proposed setup came from; null once chosen by hand or when nothing was proposed. */
  setupSource: ProposalSource | null
  weather: WeatherDraft
  dynoCorrected: boolean
  /** A reason the file cannot go further (unreadable, too large, the check failed to run). */
  error: string | null
  fieldErrors: Record<string, string>
}

let counter = 0
const nextKey = () => `f${Date.now().toString(36)}-${++counter}`
const asText = (v: number | undefined) => (v === undefined ? '' : String(Number(v.toFixed(2))))

function localPreview(text: string, mapping: Record<string, ColumnRole>): LocalPreview {
  const parsed = parsePullCsv(text, { columns: mapping })
  const first = parsed.points[0]
  const last = parsed.points[parsed.points.length - 1]
  return {
    pointCount: parsed.points.length,
    rpmFrom: first?.rpm ?? null,
    rpmTo: last?.rpm ?? null,
    units: parsed.units,
    weather: parsed.weather ?? null,
    problems: parsed.problems,
    unrecognisedHeaders: parsed.columns.filter(c => c.role === 'extra' || c.role === 'ignore').map(c => c.header),
    ok: parsed.ok,
  }
}

/** Problems with a path under files.<i> go to that file's fields; the rest are the batch's. */
function splitIssues(issues: { path: string, message: string }[], count: number) {
  const perFile: Record<string, string>[] = Array.from({ length: count }, () => ({}))
  const general: string[] = []
  for (const issue of issues) {
    const m = /^files\.(\d+)\.?(.*)$/.exec(issue.path)
    const target = m ? perFile[Number(m[1])] : undefined
    if (target) target[m![2] || ''] ??= issue.message
    else general.push(issue.message)
  }
  return { perFile, general }
}

/** Files without a setup, named: nothing is put in a setup the writer did not choose or accept. */
export function missingSetupText(names: readonly string[]): string | null {
  if (!names.length) return null
  return `Choose a setup for ${names.join(', ')}: no pull goes into a setup without your choice. Nothing was saved.`
}

export function usePullImport(benchTestId: MaybeRefOrGetter<number>, setups: MaybeRefOrGetter<readonly SetupForProposal[]>) {
  const entries = ref<ImportEntry[]>([])
  const saving = ref(false)
  const saveFraction = ref(0)
  const batchError = ref<string | null>(null)
  const batchIssues = ref<string[]>([])

  const find = (key: string) => entries.value.find(e => e.key === key)

  function fillWeather(entry: ImportEntry, weather: PullFilePreview['weather']) {
    if (!weather) return
    const w = entry.weather
    if (!w.baroInHg) w.baroInHg = asText(weather.baroInHg)
    if (!w.airTempF) w.airTempF = asText(weather.airTempF)
    if (!w.humidityPct) w.humidityPct = asText(weather.humidityPct)
  }

  async function check(key: string) {
    const entry = find(key)
    if (!entry || entry.text === null) return
    entry.stage = 'checking'
    entry.uploadFraction = 0
    entry.error = null
    entry.local = localPreview(entry.text, entry.mapping)
    fillWeather(entry, entry.local.weather)
    const mapping = Object.keys(entry.mapping).length ? entry.mapping : undefined
    try {
      const res = await postJsonWithProgress<PreviewPullsResponse>(
        benchTestPath(toValue(benchTestId), '/pulls/preview'),
        { files: [{ name: entry.name, text: entry.text, mapping }] },
        (f) => { const e = find(key); if (e) e.uploadFraction = f },
      )
      const current = find(key)
      if (!current) return
      current.preview = res.files[0] ?? null
      fillWeather(current, current.preview?.weather ?? null)
      current.stage = 'ready'
    }
    catch (err) {
      const current = find(key)
      if (!current) return
      current.stage = 'failed'
      current.error = apiFieldIssues(err).map(i => i.message).join(' ') || apiMessage(err, `${current.name} could not be checked.`)
    }
  }

  async function addFiles(files: File[]) {
    batchError.value = null
    const room = PULL_LIMITS.maxFilesPerBatch - entries.value.length
    if (files.length > room) {
      batchError.value = `One batch takes up to ${PULL_LIMITS.maxFilesPerBatch} files; ${files.length - Math.max(room, 0)} were left out. Save these first, then add the rest.`
    }
    const taken = files.slice(0, Math.max(room, 0))
    const proposals = proposeSetups(taken.map(f => f.name), toValue(setups))
    await Promise.all(taken.map(async (file, index) => {
      const entry: ImportEntry = {
        key: nextKey(),
        name: file.name,
        sizeBytes: file.size,
        text: null,
        readFraction: 0,
        uploadFraction: 0,
        stage: 'reading',
        local: null,
        preview: null,
        mapping: {},
        setupId: proposals[index]?.setupId ?? null,
        setupSource: proposals[index]?.source ?? null,
        weather: { baroInHg: '', airTempF: '', humidityPct: '' },
        dynoCorrected: false,
        error: null,
        fieldErrors: {},
      }
      entries.value.push(entry)
      const key = entry.key
      if (file.size > PULL_LIMITS.maxFileBytes) {
        const e = find(key)!
        e.stage = 'failed'
        e.error = `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; a pull file may be up to ${PULL_LIMITS.maxFileBytes / 1024 / 1024} MB.`
        return
      }
      try {
        const text = await readFileWithProgress(file, (f) => { const e = find(key); if (e) e.readFraction = f })
        const e = find(key)
        if (!e) return
        e.text = text
      }
      catch (err) {
        const e = find(key)
        if (e) { e.stage = 'failed'; e.error = (err as Error).message }
        return
      }
      await check(key)
    }))
  }

  function remove(key: string) {
    entries.value = entries.value.filter(e => e.key !== key)
  }

  function setMapping(key: string, header: string, role: ColumnRole | '') {
    const entry = find(key)
    if (!entry) return
    entry.mapping = withColumnRole(entry.mapping, header, role)
  }

  function body() {
    return {
      files: entries.value.map((e) => {
        const weather = { baroInHg: formNumber(e.weather.baroInHg), airTempF: formNumber(e.weather.airTempF), humidityPct: formNumber(e.weather.humidityPct) }
        const blank = Object.values(e.weather).every(v => v.trim() === '')
        return {
          name: e.name,
          text: e.text ?? '',
          ...(Object.keys(e.mapping).length ? { mapping: e.mapping } : {}),
          setupId: e.setupId ?? undefined,
          weather: blank && e.dynoCorrected ? null : weather,
          dynoCorrected: e.dynoCorrected,
        }
      }),
    }
  }

  const canSave = computed(() => entries.value.length > 0 && !saving.value
    && entries.value.every(e => e.stage === 'ready' && e.preview?.ok))

  function showIssues(issues: { path: string, message: string }[]) {
    const { perFile, general } = splitIssues(issues, entries.value.length)
    entries.value.forEach((e, i) => { e.fieldErrors = perFile[i] ?? {} })
    batchIssues.value = general
  }

  /** Saves every file of the batch in one request: all become pulls, or none. */
  async function save(): Promise<CommitPullsResponse | null> {
    batchError.value = null
    batchIssues.value = []
    const payload = body()
    batchError.value = missingSetupText(entries.value.filter(e => e.setupId === null).map(e => e.name))
    const parsed = CommitPullsBody.safeParse(payload)
    if (!parsed.success) {
      showIssues(parsed.error.issues.map(i => ({ path: i.path.map(String).join('.'), message: i.message })))
      return null
    }
    entries.value.forEach((e) => { e.fieldErrors = {} })
    saving.value = true
    saveFraction.value = 0
    try {
      const res = await postJsonWithProgress<CommitPullsResponse>(
        benchTestPath(toValue(benchTestId), '/pulls/import'), parsed.data, (f) => { saveFraction.value = f },
      )
      entries.value = []
      await refreshAfterPulls(toValue(benchTestId))
      return res
    }
    catch (err) {
      const status = apiStatus(err)
      const refused = status === 422 ? apiErrorData<ImportRefusedData>(err) : undefined
      if (refused?.files) {
        refused.files.forEach((preview, i) => { const e = entries.value[i]; if (e) e.preview = preview })
        batchError.value = apiMessage(err, 'The batch was refused; nothing was saved. Fix the files marked below and save again.')
      }
      else if (apiFieldIssues(err).length) {
        showIssues(apiFieldIssues(err))
        batchError.value = 'Some files need a correction; nothing was saved.'
      }
      else {
        batchError.value = apiMessage(err, 'The batch could not be saved; nothing was saved.')
      }
      return null
    }
    finally {
      saving.value = false
    }
  }

  return { entries, saving, saveFraction, batchError, batchIssues, canSave, addFiles, remove, check, setMapping, save }
}
