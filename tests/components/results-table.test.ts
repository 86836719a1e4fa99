// The story's results table as a component: one row per setup with the baseline
// marked, values as the pipeline gives them (a hand-made figure source with round,
// invented numbers: tests/unit/stories/figure-source.ts), and units kept with their number.
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import FigureResultsTable from '~/components/figure/FigureResultsTable.vue'
import { source } from '../unit/stories/figure-source'

function withFigures(props: Record<string, string> = {}, audience: 'reader' | 'editor' = 'reader') {
  const s = source()
  const figures = ref({ analysis: { ...s.analysis, standardLabel: 'SAE J1349', setups: s.analysis.setups.map(x => ({ ...x, isBaseline: x.setupId === s.analysis.baselineSetupId })) }, comparisons: s.comparisons } as never)
  return defineComponent({
    setup() {
      provideStoryFigures(figures, audience)
      return () => h(FigureResultsTable, props)
    },
  })
}

describe('FigureResultsTable', () => {
  it('lists every setup once, marks the baseline, and says what gains are measured from', async () => {
    const wrapper = await mountSuspended(withFigures())
    const rows = wrapper.findAll('tbody tr')
    expect(rows.map(r => r.find('th').text())).toEqual(['Baseline(baseline)', 'Long cam', 'Long cam + headers'])
    expect(wrapper.text()).toContain('gains are over Baseline')
    expect(wrapper.text()).toContain('SAE J1349')
  })

  it('shows each gain over the baseline, with its unit, on one line; the baseline has none', async () => {
    const wrapper = await mountSuspended(withFigures())
    const cell = (row: number, label: string) => wrapper.findAll('tbody tr')[row]!.find(`td[data-label="${label}"]`)
    // figure-source.ts: the long cam gains 31.4 hp peak and 8.6 lb-ft peak torque over the baseline.
    expect(cell(1, 'Peak power gain').text()).toBe('+31.4 hp')
    expect(cell(1, 'Peak torque gain').text()).toBe('+8.6 lb-ft')
    expect(cell(0, 'Peak power gain').text()).toBe('–')
    // Idle vacuum missing for a setup reads as a dash, not "null" or "NaN".
    expect(cell(2, 'Idle vacuum').text()).toBe('–')
    for (const td of wrapper.findAll('tbody td')) expect(td.classes()).toContain('whitespace-nowrap')
  })

  it('draws no wrong table for an unknown setup: the writer is told which, the reader sees a quiet gap', async () => {
    const editor = await mountSuspended(withFigures({ setups: '11,99' }, 'editor'))
    expect(editor.find('tbody').exists()).toBe(false)
    expect(editor.text()).toContain('Setup 99')
    const reader = await mountSuspended(withFigures({ setups: '11,99' }, 'reader'))
    expect(reader.find('tbody').exists()).toBe(false)
    expect(reader.text()).not.toContain('Setup 99')
  })
})
