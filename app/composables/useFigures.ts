import type { InjectionKey } from 'vue'
import type { StoryFigures } from '#shared/types/stories'
import { figureSourceOf, setupsUsed } from '#shared/utils/story-figure-use'

/**
 * Who is looking: readers see a figure that cannot be drawn as a quiet gap; the
 * writer's preview and the desk see why, so it can be fixed before it goes out.
 */
export type FigureAudience = 'reader' | 'editor'

interface FigureContext {
  /** What graphs and tables draw: the reader's chosen standard and units on a story page. */
  figures: Ref<StoryFigures | null>
  /** What the prose quotes: always the edition's own standard and units. */
  prose: Ref<StoryFigures | null>
  audience: FigureAudience
}

const FIGURES: InjectionKey<FigureContext> = Symbol('story-figures')

/** The story body gives its figures to the figure components placed in it. */
export function provideStoryFigures(figures: Ref<StoryFigures | null>, audience: FigureAudience, prose: Ref<StoryFigures | null> = figures) {
  provide(FIGURES, { figures, prose, audience })
}

export function useStoryFigures() {
  const ctx = inject(FIGURES, { figures: ref(null), prose: ref(null), audience: 'reader' as FigureAudience })
  const figures = computed(() => ctx.figures.value)
  const analysis = computed(() => figures.value?.analysis ?? null)
  // Inline values sit in sentences written in the edition's standard: never switched.
  const source = computed(() => figureSource(ctx.prose.value))
  return { figures, analysis, source, audience: ctx.audience }
}

/** What inlineFigureValue reads: the analysis and every pair's gains (shared/utils/story-view). */
export const figureSource = figureSourceOf

export const storyFiguresKey = (storyId: number) => `story-figures:${storyId}`

/** The ?uses= of the figures request for a draft body: the setups its figures name. */
export function usesQuery(body: string): { uses: string, sheet: '0' | '1', day: '0' | '1' } {
  const used = setupsUsed(body)
  return { uses: used.all ? 'all' : used.ids.join(','), sheet: used.buildSheet ? '1' : '0', day: used.dayReport ? '1' : '0' }
}

/**
 * Everything the story's figures are drawn from: one request per story, not per figure.
 * With a draft body, built from the setups it names (refetched when they change).
 */
export function fetchStoryFigures(storyId: MaybeRefOrGetter<number>, draftBody?: MaybeRefOrGetter<string | null>) {
  // A string first: typing that names the same setups must not refetch.
  const wanted = computed(() => {
    const body = toValue(draftBody)
    return JSON.stringify(typeof body === 'string' ? usesQuery(body) : {})
  })
  const query = computed(() => JSON.parse(wanted.value) as Record<string, string>)
  return useFetch<StoryFigures>(() => `/api/stories/${toValue(storyId)}/figures`, {
    key: computed(() => storyFiguresKey(toValue(storyId))),
    query,
  })
}

interface GraphOptions { setups?: number[], baseline?: number }
type Parsed = { success: true, data: GraphOptions } | { success: false, error: { issues: { path: PropertyKey[], message: string }[] } }

/** Why a graph cannot be drawn: bad options, no analysed pulls, or setups without data. */
export function useGraphProblems(parsed: Ref<Parsed>, analysis: Ref<StoryFigures['analysis']>, figures: Ref<StoryFigures | null>) {
  return computed(() => {
    const p = parsed.value
    if (!p.success) return p.error.issues.map(i => `${i.path.map(String).join('.') || 'graph'}: ${i.message}`)
    const a = analysis.value
    if (!a) return [figures.value?.analysisProblem ?? 'The bench test has no analysed pulls yet.']
    const known = new Set(a.setups.map(s => s.setupId))
    const wanted = [...(p.data.setups ?? []), ...(p.data.baseline !== undefined ? [p.data.baseline] : [])]
    return wanted.filter(id => !known.has(id)).map(id => `Setup ${id} has no analysed pulls in this bench test.`)
  })
}
