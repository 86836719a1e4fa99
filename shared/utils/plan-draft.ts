// The plan editor's form values (strings, as typed) to and from the plan the API takes.
import type { Acceptance, SavePlanInput, TestPlan } from '../types/dyno-day'

export interface RangeDraft { min: string, max: string }
export interface StepDraft {
  key: string
  id?: number
  /** A setup id as text, or 'new' for a planned setup named newSetupLabel. */
  setup: string
  newSetupLabel: string
  partsChange: string
  swapMinutes: string
  plannedPulls: string
  /** One checklist item per line. */
  checklist: string
  /** The items as read, so an unchanged line keeps its id and its tick. */
  itemsRead: { id: string, text: string }[]
}
export interface PlanDraft {
  rpmFrom: string
  rpmTo: string
  coolantF: RangeDraft
  oilF: RangeDraft
  airTempF: RangeDraft
  baroInHg: RangeDraft
  repeatPct: string
  notes: string
  steps: StepDraft[]
}

const text = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v))
const rangeDraft = (r: { min: number, max: number } | null): RangeDraft => ({ min: text(r?.min), max: text(r?.max) })
const num = (s: string): number => (s.trim() === '' ? Number.NaN : Number(s))
const range = (r: RangeDraft) => (r.min.trim() === '' && r.max.trim() === '' ? null : { min: num(r.min), max: num(r.max) })

let counter = 0
export const newStepKey = () => `s${++counter}`

export function emptyStep(): StepDraft {
  return { key: newStepKey(), setup: 'new', newSetupLabel: '', partsChange: '', swapMinutes: '', plannedPulls: '3', checklist: '', itemsRead: [] }
}

export function planToDraft(plan: TestPlan): PlanDraft {
  const a = plan.acceptance
  return {
    rpmFrom: text(a.rpmFrom),
    rpmTo: text(a.rpmTo),
    coolantF: rangeDraft(a.coolantF),
    oilF: rangeDraft(a.oilF),
    airTempF: rangeDraft(a.airTempF),
    baroInHg: rangeDraft(a.baroInHg),
    repeatPct: text(a.repeatPct),
    notes: plan.notes,
    steps: plan.steps.map(s => ({
      key: newStepKey(),
      id: s.id,
      setup: String(s.setupId),
      newSetupLabel: '',
      partsChange: s.partsChange,
      swapMinutes: text(s.swapMinutes),
      plannedPulls: text(s.plannedPulls),
      checklist: s.checklist.map(c => c.text).join('\n'),
      itemsRead: s.checklist.map(c => ({ id: c.id, text: c.text })),
    })),
  }
}

/** The body for PUT /plan; the schema then says what is wrong and where. */
export function draftToBody(draft: PlanDraft, version: number): Omit<SavePlanInput, 'acceptance'> & { acceptance: Acceptance } {
  return {
    version,
    notes: draft.notes,
    acceptance: {
      rpmFrom: num(draft.rpmFrom),
      rpmTo: num(draft.rpmTo),
      coolantF: range(draft.coolantF),
      oilF: range(draft.oilF),
      airTempF: range(draft.airTempF),
      baroInHg: range(draft.baroInHg),
      repeatPct: num(draft.repeatPct),
    },
    steps: draft.steps.map((s) => {
      const lines = s.checklist.split('\n').map(l => l.trim()).filter(Boolean)
      const unused = [...s.itemsRead]
      return {
        ...(s.id === undefined ? {} : { id: s.id }),
        setupId: s.setup === 'new' ? null : Number(s.setup),
        ...(s.setup === 'new' ? { newSetupLabel: s.newSetupLabel } : {}),
        partsChange: s.partsChange,
        swapMinutes: s.swapMinutes.trim() === '' ? null : num(s.swapMinutes),
        plannedPulls: num(s.plannedPulls),
        checklist: lines.map((line) => {
          const i = unused.findIndex(u => u.text === line)
          const id = i >= 0 ? unused.splice(i, 1)[0]!.id : undefined
          return id ? { id, text: line } : { text: line }
        }),
      }
    }),
  }
}
