import { analysisViewQuery, hasAnalysisView, parseAnalysisView, type AnalysisView } from '~/utils/analysisViewQuery'
import { useWorkspaceStore } from '~/stores/workspace'
import type { AnalysisUnits } from '#shared/types/analysis'
import type { AnalysisChoice } from './useAnalysis'

/**
 * The analysis page's choices, kept in the URL (bookmarkable, shareable) and mirrored
 * in the workspace store, so coming back to the page without a query (from the
 * bench test's tabs) shows the view left behind. Changes replace the history entry:
 * the back button leaves the page instead of stepping through every tick box.
 */
export function useAnalysisView(benchTestId: MaybeRefOrGetter<number>) {
  const route = useRoute()
  const router = useRouter()
  const store = useWorkspaceStore()

  const fromUrl = computed(() => parseAnalysisView(route.query))
  const choice = computed<AnalysisChoice>(() => {
    const q = fromUrl.value
    return { setupIds: q.setupIds, baselineId: q.baselineId, standard: q.standard, units: q.units ?? store.units }
  })

  function write(view: AnalysisView, units: AnalysisUnits) {
    store.setView(toValue(benchTestId), view)
    store.units = units
    return router.replace({ query: analysisViewQuery({ ...view, units }, route.query) })
  }

  // A link with a view wins and is remembered; a bare link shows the remembered view.
  onMounted(() => {
    const id = toValue(benchTestId)
    if (hasAnalysisView(route.query)) {
      const q = fromUrl.value
      store.setView(id, { setupIds: q.setupIds, baselineId: q.baselineId, standard: q.standard })
      if (q.units) store.units = q.units
    }
    else if (store.views[id]) {
      void write(store.view(id), store.units)
    }
  })

  return {
    choice,
    set(patch: Partial<AnalysisView>) {
      const { units, ...view } = choice.value
      return write({ ...view, ...patch }, units)
    },
    setUnits(units: AnalysisUnits) {
      const { units: _, ...view } = choice.value
      return write(view, units)
    },
  }
}
