import { describe, expect, it } from 'vitest'
import { PartSpecSchema } from '#shared/types/setups'
import { emptyPartDraft, partFromDraft, partToDraft } from '#shared/utils/part-fields'
import { formNullableNumber, formNumber } from '#shared/utils/form-values'
import { formatReported, formatSigned } from '#shared/utils/figures'
import { mergeDrafts } from '#shared/utils/draft-merge'

describe('part card drafts', () => {
  it('turns a filled cam card into a spec the schema accepts, and back', () => {
    const draft = { ...emptyPartDraft('camshaft'), intakeDuration050Deg: '224', exhaustDuration050Deg: '230', intakeLiftIn: '0.560', exhaustLiftIn: '0.570', lsaDeg: '112', iclDeg: '108', maker: 'Invented Cam Co.' }
    const parsed = PartSpecSchema.safeParse(partFromDraft(draft))
    expect(parsed.success).toBe(true)
    expect(parsed.data).toMatchObject({ category: 'camshaft', intakeDuration050Deg: 224, lsaDeg: 112, maker: 'Invented Cam Co.' })
    expect(parsed.data).not.toHaveProperty('intakeAdvertisedDeg')
    expect(partToDraft(parsed.data!)).toMatchObject({ intakeLiftIn: '0.56', iclDeg: '108', intakeAdvertisedDeg: '' })
  })

  it('leaves an empty required figure missing so the schema names it', () => {
    const parsed = PartSpecSchema.safeParse(partFromDraft(emptyPartDraft('carburetor')))
    expect(parsed.success).toBe(false)
    expect(parsed.error!.issues[0]!.path).toEqual(['airflowCfm'])
  })

  it('sends an empty required text as empty so "Say what the part is" shows', () => {
    const parsed = PartSpecSchema.safeParse(partFromDraft(emptyPartDraft('other')))
    expect(parsed.error!.issues.map(i => i.message)).toContain('Say what the part is')
  })
})

describe('form numbers', () => {
  it('reads an empty box as not given, never as 0', () => {
    expect(formNumber('')).toBeUndefined()
    expect(formNumber('  ')).toBeUndefined()
    expect(formNullableNumber('')).toBeNull()
    expect(formNumber('4.030')).toBe(4.03)
    expect(formNumber('abc')).toBeNaN()
  })
})

describe('reported figures', () => {
  // Product brief: reported peaks round half away from zero (487.5 hp -> 488 hp).
  it('rounds half away from zero before printing', () => {
    expect(formatReported(487.5)).toBe('488')
    expect(formatReported(-487.5)).toBe('-488')
    expect(formatReported(5600)).toBe('5,600')
    expect(formatReported(1.005, 2)).toBe('1.01')
    expect(formatReported(null)).toBe('–')
  })

  it('signs gains', () => {
    expect(formatSigned(12.44)).toBe('+12.4')
    expect(formatSigned(-3)).toBe('-3.0')
    expect(formatSigned(0.04)).toBe('0.0')
  })
})

describe('merging a form with a newer save', () => {
  const base = { title: 'A', shop: '', notes: 'x' }
  it('keeps my changed fields and takes theirs everywhere else', () => {
    const m = mergeDrafts(base, { ...base, title: 'Mine' }, { ...base, shop: 'Their shop', title: 'Theirs' })
    expect(m.merged).toEqual({ title: 'Mine', shop: 'Their shop', notes: 'x' })
    expect(m.mine).toEqual(['title'])
    expect(m.theirs).toEqual(['title', 'shop'])
    expect(m.both).toEqual(['title'])
  })

  it('does not call a field contested when both typed the same', () => {
    const m = mergeDrafts(base, { ...base, notes: 'y ' }, { ...base, notes: 'y' })
    expect(m.both).toEqual([])
  })
})
