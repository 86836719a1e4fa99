// What a story's figures are drawn from: issue 4's analysis of its bench test (in
// hp and lb-ft, the bench test's default standard) plus the gains of every ordered
// pair of setups, so an inline value may compare any two. The story grants access
// to its bench test's figures, whoever owns the bench test.
import type { Knex } from 'knex'
import type { EngineFamily, PartType } from '#shared/types/catalog'
import type { NumberCheckResult, StoryFigures, StoryPhoto, StoryReaderView } from '#shared/types/stories'
import type { FigureComparison } from '#shared/types/story-figures'
import type { CurrentUser } from '#shared/types/users'
import type { AnalysisResponse, BenchTest } from '#shared/types/workspace'
import { checkNumbers, comparedPairs, figureCandidates, pairsNamedInBody, type CandidateSource } from '#shared/utils/number-check'
import { figureProblems } from '#shared/utils/story-body'

type Db = Knex | Knex.Transaction

async function storyBenchTest(db: Db, benchTestId: number): Promise<BenchTest> {
  const row = await db('bench_tests').join('users as owner', 'owner.id', 'bench_tests.owner_id')
    .where('bench_tests.id', benchTestId).first('bench_tests.*', 'owner.display_name as owner_name')
  if (!row) notFound('The bench test of this story is gone.')
  return toBenchTest(row)
}

/** runAnalysis refuses (400) a bench test without usable pulls; for a story that is a state, not an error. */
async function analysisOrProblem(db: Db, benchTest: BenchTest, baseline?: number): Promise<{ analysis: AnalysisResponse | null, problem: string | null }> {
  try {
    const analysis = await runAnalysis(db, benchTest, { units: 'hp-lbft', ...(baseline ? { baseline, maxPoints: 20 } : {}) })
    return { analysis, problem: null }
  }
  catch (error) {
    const status = (error as { statusCode?: number }).statusCode
    if (status === 400) return { analysis: null, problem: (error as Error).message }
    throw error
  }
}

/** Gains of every analysed setup against every other, from the full curves (one analysis per reference setup). */
async function allComparisons(db: Db, benchTest: BenchTest, main: AnalysisResponse): Promise<FigureComparison[]> {
  const fromRows = (a: AnalysisResponse) => a.table.rows.slice(1).flatMap(r => r.vsBaseline ? [{ setupId: r.setupId, vsSetupId: a.baselineSetupId, gains: r.vsBaseline }] : [])
  const out = fromRows(main)
  for (const s of main.setups) {
    if (s.setupId === main.baselineSetupId) continue
    const { analysis } = await analysisOrProblem(db, benchTest, s.setupId)
    if (analysis) out.push(...fromRows(analysis))
  }
  return out
}

export interface FigureOptions {
  /** 'bench': every photo of the bench test (the editor's picker); 'used': only those the story uses (readers). */
  photos: 'bench' | 'used'
  photoUrl?: (photoId: number, width: number) => string
}

export async function storyFigures(db: Db, row: StoryRow, opts: FigureOptions): Promise<StoryFigures> {
  const benchTest = await storyBenchTest(db, row.bench_test_id)
  const [{ analysis, problem }, buildSheet, setups, photoRows] = await Promise.all([
    analysisOrProblem(db, benchTest),
    getBuildSheet(db, benchTest.id),
    listSetups(db, benchTest.id),
    db('photos').where('bench_test_id', benchTest.id).orderBy('position').orderBy('id') as Promise<PhotoRecord[]>,
  ])
  const comparisons = analysis ? await allComparisons(db, benchTest, analysis) : []
  const used = opts.photos === 'used' ? await usedPhotoIds(db, row) : null
  const photos: StoryPhoto[] = (used ? used.map(id => photoRows.find(p => p.id === id)!).filter(Boolean) : photoRows)
    .map(p => toStoryPhoto(p, opts.photoUrl))
  const problems = figureProblems(row.body, {
    setupIds: new Set(setups.map(s => s.id)),
    analysedSetupIds: new Set(analysis?.setups.map(s => s.setupId) ?? []),
    photoIds: new Set(photoRows.map(p => p.id)),
  })
  return { benchTestId: benchTest.id, analysis, analysisProblem: problem, comparisons, buildSheet, setups, photos, problems }
}

export async function getStoryFigures(user: CurrentUser, storyId: number): Promise<StoryFigures> {
  const db = useDb()
  return storyFigures(db, await requireStoryRow(db, user, storyId), { photos: 'bench' })
}

/** The number check of the story's current text; an editor opening it records it as seen for this version. */
export async function runNumberCheck(user: CurrentUser, storyId: number): Promise<NumberCheckResult> {
  const db = useDb()
  const row = await requireStoryRow(db, user, storyId)
  const figures = await storyFigures(db, row, { photos: 'used' })
  let candidates: ReturnType<typeof figureCandidates> = []
  if (figures.analysis) {
    const source: CandidateSource = {
      analysis: figures.analysis,
      comparisons: figures.comparisons,
      pullWeather: figures.analysis.setups.flatMap(s => s.pulls.map(p => ({ setupId: s.setupId, weather: p.weather }))),
    }
    candidates = figureCandidates(source, comparedPairs(source, pairsNamedInBody(row.body, figures.analysis.baselineSetupId)))
  }
  const findings = checkNumbers(row.body, candidates)
  let seenRecorded = false
  if (seesAllBenchTests(user)) {
    // Only for the version checked: a save in between makes the approval ask again.
    // Setting updated_at to itself keeps ON UPDATE from marking the story as changed.
    seenRecorded = await db('stories').where({ id: row.id, version: row.version }).update({ number_check_seen_version: row.version, updated_at: db.raw('updated_at') }) > 0
  }
  return {
    storyId: row.id,
    storyVersion: row.version,
    checkedAt: new Date().toISOString(),
    findings,
    flagged: findings.filter(f => !f.matched).length,
    analysisProblem: figures.analysisProblem,
    seenRecorded,
  }
}

/** What the reader's page shows: the story's current text, its figures and only the photos it uses. */
export async function storyReaderView(db: Db, row: StoryRow, opts: { preview: boolean, photoUrl?: (photoId: number, width: number) => string }): Promise<StoryReaderView> {
  const [figures, summaries, benchTest] = await Promise.all([
    storyFigures(db, row, { photos: 'used', photoUrl: opts.photoUrl }),
    storySummaries(db, [row]),
    storyBenchTest(db, row.bench_test_id),
  ])
  const summary = summaries[0]!
  return {
    story: {
      id: row.id,
      slug: row.slug,
      headline: row.headline,
      deck: row.deck,
      bylines: summary.bylines,
      body: row.body,
      heroPhoto: figures.photos.find(p => p.id === row.hero_photo_id) ?? null,
      tags: summary.tags,
      engineFamily: row.engine_family as EngineFamily,
      partType: row.part_type as PartType,
      searchTitle: row.search_title,
      searchDescription: row.search_description,
      state: row.state,
      publishedAt: summary.publishedAt,
      updatedAt: summary.updatedAt,
    },
    benchTest: { id: benchTest.id, title: benchTest.title, shop: benchTest.shop, dyno: benchTest.dyno, testedFrom: benchTest.testedFrom, testedTo: benchTest.testedTo },
    figures,
    preview: opts.preview,
  }
}
