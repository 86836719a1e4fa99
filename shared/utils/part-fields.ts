// The fields of each part card, in the order the form shows them, so one card
// component serves every category. Validation stays with PartSpecSchema
// (shared/types/setups.ts); this only says how to ask for each figure.
import { EXHAUST_STYLES, INTAKE_MANIFOLD_TYPES, type PartCategory, type PartSpec } from '../types/setups'

export interface PartField {
  key: string
  label: string
  kind: 'number' | 'text' | 'textarea' | 'select'
  unit?: string
  /** Input step for number fields. */
  step?: number
  options?: readonly { id: string, label: string }[]
  required?: boolean
}

const COMMON: PartField[] = [
  { key: 'maker', label: 'Maker', kind: 'text' },
  { key: 'model', label: 'Part name or number', kind: 'text' },
  { key: 'notes', label: 'Notes', kind: 'textarea' },
]

const deg = (key: string, label: string, required = true): PartField => ({ key, label, kind: 'number', unit: 'deg', step: 0.5, required })
const inch = (key: string, label: string, required = true, step = 0.001): PartField => ({ key, label, kind: 'number', unit: 'in', step, required })
const cc = (key: string, label: string, required = true): PartField => ({ key, label, kind: 'number', unit: 'cc', step: 0.1, required })

export const PART_FIELDS: Record<PartCategory, PartField[]> = {
  'camshaft': [
    deg('intakeDuration050Deg', 'Intake duration at 0.050 in'),
    deg('exhaustDuration050Deg', 'Exhaust duration at 0.050 in'),
    deg('intakeAdvertisedDeg', 'Intake advertised duration', false),
    deg('exhaustAdvertisedDeg', 'Exhaust advertised duration', false),
    inch('intakeLiftIn', 'Intake valve lift'),
    inch('exhaustLiftIn', 'Exhaust valve lift'),
    deg('lsaDeg', 'Lobe separation angle'),
    deg('iclDeg', 'Intake centerline'),
  ],
  'intake-manifold': [
    { key: 'type', label: 'Manifold type', kind: 'select', options: INTAKE_MANIFOLD_TYPES, required: true },
    { key: 'runnerNotes', label: 'Runners', kind: 'textarea' },
    { key: 'plenumNotes', label: 'Plenum', kind: 'textarea' },
  ],
  'carburetor': [{ key: 'airflowCfm', label: 'Rated airflow', kind: 'number', unit: 'cfm', step: 1, required: true }],
  'throttle-body': [
    { key: 'boreMm', label: 'Bore', kind: 'number', unit: 'mm', step: 0.5, required: true },
    { key: 'bores', label: 'Number of bores', kind: 'number', step: 1 },
  ],
  'headers': [
    { key: 'style', label: 'Style', kind: 'select', options: EXHAUST_STYLES, required: true },
    inch('primaryDiameterIn', 'Primary tube diameter', false, 0.125),
    inch('primaryLengthIn', 'Primary tube length', false, 0.5),
    inch('collectorDiameterIn', 'Collector diameter', false, 0.125),
  ],
  'cylinder-heads': [
    cc('intakePortCc', 'Intake port volume'),
    cc('exhaustPortCc', 'Exhaust port volume', false),
    cc('chamberCc', 'Chamber volume', false),
    inch('intakeValveIn', 'Intake valve diameter'),
    inch('exhaustValveIn', 'Exhaust valve diameter'),
  ],
  'ignition-timing': [
    deg('totalAdvanceDeg', 'Total advance'),
    deg('initialAdvanceDeg', 'Initial advance', false),
    { key: 'allInByRpm', label: 'All in by', kind: 'number', unit: 'rpm', step: 50 },
  ],
  'other': [
    { key: 'title', label: 'What the part is', kind: 'text', required: true },
    { key: 'details', label: 'Details', kind: 'textarea' },
  ],
}

export function partFields(category: PartCategory): PartField[] {
  return [...PART_FIELDS[category], ...COMMON]
}

/** What a card's inputs hold: text as typed, keyed by field. */
export type PartDraft = { category: PartCategory } & Record<string, string>

export function emptyPartDraft(category: PartCategory): PartDraft {
  const draft: PartDraft = { category }
  for (const f of partFields(category)) draft[f.key] = ''
  return draft
}

export function partToDraft(part: PartSpec): PartDraft {
  const draft = emptyPartDraft(part.category)
  const values = part as unknown as Record<string, unknown>
  for (const f of partFields(part.category)) {
    const v = values[f.key]
    if (v !== undefined && v !== null) draft[f.key] = String(v)
  }
  return draft
}

/**
 * The object to validate with PartSpecSchema: numbers parsed, empty optional
 * fields left out. A required field left empty stays missing, so the schema's
 * own message ("Enter ... in degrees") reaches the form.
 */
export function partFromDraft(draft: PartDraft): Record<string, unknown> {
  const out: Record<string, unknown> = { category: draft.category }
  for (const f of partFields(draft.category)) {
    const raw = (draft[f.key] ?? '').trim()
    if (raw === '') {
      if (f.required && f.kind !== 'number' && f.kind !== 'select') out[f.key] = ''
      continue
    }
    out[f.key] = f.kind === 'number' ? Number(raw) : raw
  }
  return out
}
