// What a story's figures are drawn from: issue 4's analysis of its bench test (in
// hp and lb-ft, the bench test's default standard) plus the gains of every ordered
// pair of setups, so an inline value may compare any two. The story grants access
// to its bench test's figures, whoever owns the bench test.
import type { Db } from '../../utils/db'
import type { EngineFamily, PartType } from '#shared/types/catalog'
import type { NumberCheckResult, StoryFigures, StoryPhoto, StoryReaderView } from '#shared/types/stories'
import type { CurrentUser } from '#shared/types/users'
import { checkNumbers, comparedPairs, figureCandidates, pairsNamedInBody, type CandidateSource } from '#shared/utils/number-check'
import { figureProblems } from '#shared/utils/story-body'
import type { SetupsUsed } from '#shared/utils/story-figure-use'
import type { PhotoRecord } from '../photos/access'
import { figuresOf, liveStoryData, storyDataHash, storyDayReport } from './editions'
import { toStoryPhoto } from './photos'
import { requireStoryRow, type StoryRow, storySummaries } from './stories'
import { seesAllBenchTests } from '../workspace/bench-test-access'
import { listSetups } from '../workspace/setups'

export interface FigureOptions {
  /** 'bench': every photo of the bench test (the editor's picker); 'used': only those the story uses (readers). */
  photos: 'bench' | 'used'
  photoUrl?: (photoId: number, width: number) => string
  /** The setups to take instead of the saved body's (the editor's draft names others). */
  uses?: SetupsUsed
}

/** The story's figures from the live workspace, built exactly as an edition's would be. */
export async function storyFigures(db: Db, row: StoryRow, opts: FigureOptions): Promise<StoryFigures> {
  const data = await liveStoryData(db, row, opts.uses)
  const [photoRows, live] = await Promise.all([
    db('photos').where('bench_test_id', row.bench_test_id).orderBy('position').orderBy('id') as Promise<PhotoRecord[]>,
    opts.photos === 'bench' ? listSetups(db, row.bench_test_id) : Promise.resolve(null),
  ])
  const shownIds = opts.photos === 'used' ? data.photoIds : photoRows.map(p => p.id)
  const photos: StoryPhoto[] = shownIds.map(id => photoRows.find(p => p.id === id)).filter(p => p !== undefined).map(p => toStoryPhoto(p, opts.photoUrl))
  const figures = figuresOf(data, storyDataHash(data), { photos })
  const analysed = new Set((await db('pulls').whereIn('setup_id', (live ?? data.setups).map(s => s.id)).where('included', true).distinct().pluck('setup_id')) as number[])
  const problems = figureProblems(row.body, {
    setupIds: new Set((live ?? data.setups).map(s => s.id)),
    analysedSetupIds: analysed,
    photoIds: new Set(photoRows.map(p => p.id)),
  })
  // The editor's picker offers every setup of the bench test; readers get only the story's.
  const benchSetups = live?.map(s => ({ setupId: s.id, label: s.label, isBaseline: s.isBaseline, analysed: analysed.has(s.id) }))
  // The picker shows what the test day would say before the body places it.
  const dayReport = live && figures.dayReport === undefined ? { dayReport: await storyDayReport(db, { id: data.benchTest.id, defaultStandard: data.bench.defaultStandard }) } : {}
  return { ...figures, ...(live ? { setups: live, benchSetups } : {}), ...dayReport, problems }
}

export async function getStoryFigures(db: Db, user: CurrentUser, storyId: number, uses?: SetupsUsed): Promise<StoryFigures> {
  return storyFigures(db, await requireStoryRow(db, user, storyId), { photos: 'bench', uses })
}

/** The number check of the story's current text; an editor opening it records it as seen for this version. */
export async function runNumberCheck(db: Db, user: CurrentUser, storyId: number): Promise<NumberCheckResult> {
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
  const [figures, summaries] = await Promise.all([
    storyFigures(db, row, { photos: 'used', photoUrl: opts.photoUrl }),
    storySummaries(db, [row]),
  ])
  const benchTest = (await liveStoryData(db, row)).benchTest
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
    benchTest,
    figures,
    preview: opts.preview,
  }
}
