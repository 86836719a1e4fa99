import { defineStore } from 'pinia'
import type { AnalysisUnits } from '#shared/types/analysis'
import type { CorrectionStandard } from '#shared/dyno'

interface AnalysisView {
  /** null: every setup with included pulls. */
  setupIds: number[] | null
  baselineId: number | null
  standard: CorrectionStandard | null
}

// What the writer chose to look at, per bench test: interface state only. The
// figures themselves stay in the useFetch cache.
export const useWorkspaceStore = defineStore('workspace', {
  state: () => ({
    units: 'hp-lbft' as AnalysisUnits,
    views: {} as Record<number, AnalysisView>,
  }),
  actions: {
    view(benchTestId: number): AnalysisView {
      return this.views[benchTestId] ?? { setupIds: null, baselineId: null, standard: null }
    },
    setView(benchTestId: number, patch: Partial<AnalysisView>) {
      this.views[benchTestId] = { ...this.view(benchTestId), ...patch }
    },
  },
})
