import type { MagazineStoryResponse, ReaderPreferences } from '#shared/types/magazine'
import { memoOn } from '#shared/utils/object-memo'
import { withPageCurves } from '#shared/utils/page-curves'
import type { StoryFigures } from '#shared/types/stories'
import type { AnalysisUnits } from '#shared/types/analysis'
import type { AnalysisResponse } from '#shared/types/analysis-results'
import type { CorrectionStandard } from '#shared/dyno'

export const storyPageKey = (slug: string) => `magazine:story:${slug}`
export const storyAnalysisKey = (slug: string, standard: string, units: string) => `magazine:story-analysis:${slug}:${standard}:${units}`

export const storyApiPath = (slug: string, sub = '') => `/api/magazine/stories/${encodeURIComponent(slug)}${sub}`

/** The published story (or the desk's preview of it) as the reader's page shows it. */
export function useStoryPage(slug: MaybeRefOrGetter<string>) {
  // The server render reads it from the services with the request's user (RenderData);
  // in the browser the cookie goes with the API call.
  // (Typed by hand: inferring the route type of a built path exhausts the compiler.)
  const render = import.meta.server ? useRequestEvent()?.context.renderData : undefined
  const get = $fetch as (path: string) => Promise<unknown>
  return useAsyncData<MagazineStoryResponse>(
    () => storyPageKey(toValue(slug)),
    // The server render thins the curves once per kept view (withPageCurves): the page and its
    // payload carry them once, lightly; a browser navigating here gets the API's full view.
    () => (render
      ? render.readerStory(toValue(slug)).then(view => memoOn(view, 'page-curves', () => withPageCurves(view)))
      : get(storyApiPath(toValue(slug))) as Promise<MagazineStoryResponse>),
  )
}

/** Set when a graph of the page turns live: the page then wants the edition's full curves. */
export const useFullCurvesWanted = () => useState<boolean>('story-full-curves', () => false)

/**
 * The reader's standard and units to fetch the figures in, or null for the page's own
 * figures. The page's own standard and units are fetched too once a graph is live and
 * the page carries thinned curves (`curvesStepRpm`), so the readout reads the full ones.
 */
export function figuresWanted(view: MagazineStoryResponse | null | undefined, prefs: ReaderPreferences, liveGraph: boolean): { standard: CorrectionStandard, units: AnalysisUnits } | null {
  const a = view?.figures.analysis
  if (!a) return null
  const standard = prefs.standard && correctable(a) ? prefs.standard : a.standard
  const units = prefs.units ?? a.units.id
  if (standard !== a.standard || units !== a.units.id) return { standard, units }
  return liveGraph && view.curvesStepRpm ? { standard, units } : null
}

/**
 * The story's results in the reader's correction standard and units. Not fetched
 * while the reader keeps the story's own settings: the page already has those.
 */
export function useStoryAnalysis(slug: MaybeRefOrGetter<string>, choice: MaybeRefOrGetter<{ standard: CorrectionStandard, units: AnalysisUnits }>) {
  return useAsyncData<AnalysisResponse>(
    () => storyAnalysisKey(toValue(slug), toValue(choice).standard, toValue(choice).units),
    () => $fetch<AnalysisResponse>(storyApiPath(toValue(slug), '/analysis'), { query: toValue(choice) }),
    { watch: [() => toValue(choice)], server: false, immediate: false },
  )
}

/** The CSV of the results table with the reader's settings. */
export function storyDataUrl(slug: string, choice: { standard: CorrectionStandard, units: AnalysisUnits }): string {
  return `${storyApiPath(slug, '/data.csv')}?${new URLSearchParams(choice).toString()}`
}

export const readerFiguresKey = (slug: string, choice: string) => `magazine:story-figures:${slug}:${choice}`

type SwitchedFigures = Pick<StoryFigures, 'analysis' | 'analysisProblem' | 'comparisons'>

/** The story's figures in the reader's standard and units (null: the page's own are shown). */
export function useReaderFigures(slug: MaybeRefOrGetter<string>, choice: MaybeRefOrGetter<{ standard: CorrectionStandard, units: AnalysisUnits } | null>) {
  return useAsyncData<SwitchedFigures | null>(
    () => readerFiguresKey(toValue(slug), toValue(choice) ? `${toValue(choice)!.standard}:${toValue(choice)!.units}` : 'own'),
    () => {
      const chosen = toValue(choice)
      const get = $fetch as (path: string, opts: { query: Record<string, string> }) => Promise<unknown>
      return chosen ? get(storyApiPath(toValue(slug), '/figures'), { query: chosen }) as Promise<SwitchedFigures> : Promise.resolve(null)
    },
    { watch: [() => toValue(choice)], server: false },
  )
}

/** True when every pull of the analysis carries weather the site can correct with. */
export function correctable(analysis: AnalysisResponse | null | undefined): boolean {
  return !!analysis && analysis.setups.every(s => s.pulls.every(p => p.weather !== null && !p.dynoCorrected))
}
