// The bench test form as typed (all strings) and the body it sends.
import type { BenchTest } from '../types/bench-tests'
import type { CorrectionStandard } from '../dyno/types'
import type { EngineFamily, PartType } from '../types/catalog'
import { formNullableDate } from './form-values'

export interface BenchTestDraft {
  title: string
  engineFamily: string
  partType: string
  shop: string
  dyno: string
  testedFrom: string
  testedTo: string
  notes: string
  defaultStandard: string
}

export const BENCH_TEST_FIELD_LABELS: Record<keyof BenchTestDraft, string> = {
  title: 'Title',
  engineFamily: 'Engine family',
  partType: 'What is tested',
  shop: 'Shop',
  dyno: 'Dyno',
  testedFrom: 'First test day',
  testedTo: 'Last test day',
  notes: 'Notes',
  defaultStandard: 'Correction standard',
}

export function benchTestDraft(bt?: BenchTest | null): BenchTestDraft {
  return {
    title: bt?.title ?? '',
    engineFamily: bt?.engineFamily ?? 'pushrod-v8',
    partType: bt?.partType ?? 'camshaft',
    shop: bt?.shop ?? '',
    dyno: bt?.dyno ?? '',
    testedFrom: bt?.testedFrom ?? '',
    testedTo: bt?.testedTo ?? '',
    notes: bt?.notes ?? '',
    defaultStandard: bt?.defaultStandard ?? 'sae-j1349-1990',
  }
}

/** The fields as the schemas take them (the zod parse decides whether they hold). */
export function benchTestFieldsBody(d: BenchTestDraft) {
  return {
    title: d.title,
    engineFamily: d.engineFamily as EngineFamily,
    partType: d.partType as PartType,
    shop: d.shop,
    dyno: d.dyno,
    testedFrom: formNullableDate(d.testedFrom),
    testedTo: formNullableDate(d.testedTo),
    notes: d.notes,
    defaultStandard: d.defaultStandard as CorrectionStandard,
  }
}

/** Fields where two drafts differ, for the "someone else saved meanwhile" dialog. */
export function changedBenchTestFields(mine: BenchTestDraft, theirs: BenchTestDraft): (keyof BenchTestDraft)[] {
  return (Object.keys(BENCH_TEST_FIELD_LABELS) as (keyof BenchTestDraft)[]).filter(k => mine[k].trim() !== theirs[k].trim())
}

/** One line of the conflict dialog: a field, as typed here and as saved by someone else. */
export interface ConflictField { label: string, mine: string, theirs: string }
