// The editor's figure picker: each figure starts from its kind's defaults and nothing
// carries over from the figure before (issue 15 item 4). Mounted in Nuxt's test
// environment; the snippet it would insert is read from the dialog.
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import EditorFigurePicker from '~/components/editor/EditorFigurePicker.vue'

const setup = (setupId: number, label: string, isBaseline = false) => ({ setupId, label, isBaseline, analysed: true })
const figures = {
  benchSetups: [setup(11, 'Baseline', true), setup(12, 'Street cam'), setup(13, 'Race cam')],
  analysis: null,
  analysisProblem: 'No pulls in this sketch.',
  comparisons: [],
  setups: [],
  photos: [],
}

async function picker() {
  const wrapper = await mountSuspended(EditorFigurePicker, { props: { open: true, figures: figures as never } })
  const snippet = () => wrapper.get('[data-testid="picker-snippet"]').text()
  const choose = async (kind: string) => wrapper.get('[data-testid="picker-kind"] select, select[data-testid="picker-kind"], #picker-kind').setValue(kind)
  return { wrapper, snippet, choose }
}

describe('EditorFigurePicker', () => {
  it('starts a results table with the baseline and every setup', async () => {
    const { snippet, choose } = await picker()
    await choose('results-table')
    expect(snippet()).toContain('::results-table{setups="11,12,13"}')
  })

  it('keeps the setup the gains are measured from in a results table when another is unticked', async () => {
    const { wrapper, snippet, choose } = await picker()
    await choose('results-table')
    await wrapper.get('[data-testid="picker-setup-12"]').setValue(false)
    expect(snippet()).toContain('setups="11,13"')
    await wrapper.get('[data-testid="picker-setup-11"]').setValue(false)
    expect(snippet()).toContain('setups="11,13"') // the baseline stays in
  })

  it('carries nothing over: a caption typed for one figure is gone after a change of kind', async () => {
    const { wrapper, snippet, choose } = await picker()
    await choose('pull-graph')
    await wrapper.get('[data-testid="picker-caption"] input, input[data-testid="picker-caption"], #picker-caption').setValue('Power of the race cam')
    expect(snippet()).toContain('Power of the race cam')
    await choose('results-table')
    expect(snippet()).not.toContain('Power of the race cam')
    await choose('pull-graph')
    expect(snippet()).not.toContain('Power of the race cam')
  })
})
