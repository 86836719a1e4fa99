import type { MagazineStoryResponse } from '#shared/types/magazine'
import type { StoryFigures } from '#shared/types/stories'
import type { AnalysisUnits } from '#shared/types/analysis'
import type { AnalysisResponse } from '#shared/types/workspace'
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
    () => (render ? render.readerStory(toValue(slug)) : get(storyApiPath(toValue(slug))) as Promise<MagazineStoryResponse>),
  )
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
