// The import's file card (issue 15 item 1): no setup is assumed, a proposal says where
// it came from, the choice shows the setup's full label, and choosing by hand makes it
// no longer a proposal. Mounted in Nuxt's test environment.
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import PullFileCard from '~/components/pull/PullFileCard.vue'
import { PROPOSAL_TEXT } from '#shared/utils/setup-proposal'

const setup = (id: number, position: number, label: string, isBaseline = false) => ({
  id, benchTestId: 1, position, isBaseline, label, description: '', parts: [], idleChecks: [], idleVacuumInHg: null,
  pullCount: 0, includedPullCount: 0, version: 1, updatedAt: '2026-12-01T10:00:00.000Z',
})
const SETUPS = [setup(5, 1, 'Production hydraulic roller cam, stock intake and exhaust', true), setup(6, 2, 'Street cam 224/230 at 0.050 in')]
const facts = { pointCount: 400, rpmFrom: 2500, rpmTo: 6500, units: { power: 'hp', torque: 'lb-ft' }, weather: null, unrecognisedHeaders: [], problems: [] }

function mount(setupId: number | null, setupSource: 'file-name' | 'batch-order' | null) {
  return mountSuspended(PullFileCard, {
    props: {
      idPrefix: 'f1', facts: facts as never, mapping: {}, setups: SETUPS as never, errors: {}, setupTestid: 'file-setup',
      setupId, setupSource, weather: { baroInHg: '', airTempF: '', humidityPct: '' }, dynoCorrected: false,
    },
  })
}

describe('PullFileCard', () => {
  it('assumes no setup: the choice starts empty and says so', async () => {
    const wrapper = await mount(null, null)
    const select = wrapper.get('select').element as HTMLSelectElement
    expect(select.selectedOptions[0]?.text).toBe('Choose a setup')
    expect(select.selectedOptions[0]?.disabled).toBe(true)
    expect(wrapper.text()).toContain('No setup is assumed')
  })

  it('shows a proposal in full with where it came from; a choice by hand is no longer a proposal', async () => {
    const wrapper = await mount(6, 'file-name')
    expect(wrapper.text()).toContain('2. Street cam 224/230 at 0.050 in.')
    expect(wrapper.text()).toContain(PROPOSAL_TEXT['file-name'])
    const options = wrapper.findAll('option').map(o => o.text())
    expect(options).toContain('1. Production hydraulic roller cam, stock intake and exhaust (baseline)')
    await wrapper.get('select').setValue('5')
    expect(wrapper.emitted('update:setupSource')?.at(-1)).toEqual([null])
    expect(wrapper.emitted('update:setupId')?.at(-1)).toEqual([5])
  })
})
