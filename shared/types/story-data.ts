// A story's data: exactly what its figures are drawn from, as plain JSON. The server
// snapshots it from the live workspace (the editor's preview, the number check) and
// freezes it into an edition when an editor approves the story; readers' pages are
// built only from an edition's copy. Same data in, same figures out (story-view.ts).
import type { BenchData } from '../dyno/analyse'
import type { DayReport } from './dyno-day'
import type { BuildSheet } from './build-sheets'
import type { Setup } from './setups'
import type { FigureUnit } from './story-figures'

export const STORY_DATA_FORMAT = 1

export interface StoryData {
  /** Shape of this object; a later format reads older ones or says it cannot. */
  format: typeof STORY_DATA_FORMAT
  benchTest: { id: number, title: string, shop: string, dyno: string, testedFrom: string | null, testedTo: string | null }
  /**
   * The setups the story uses (named by a figure, every analysed one when a figure
   * names none, and always the baseline) with their included pulls, points and
   * weather, and the bench test's correction standard.
   */
  bench: BenchData
  /** Those setups' parts and idle checks (cam cards), without edit bookkeeping. */
  setups: Setup[]
  /** Only when the body shows the build sheet. */
  buildSheet: BuildSheet | null
  /**
   * Only when the body shows the test day (::day-report): the plan against what
   * happened, null when the bench test has no plan. Absent otherwise, so data
   * frozen before this existed hashes the same.
   */
  dayReport?: DayReport | null
  /** Photos the story shows: hero first, then the body's, in order. */
  photoIds: number[]
  /** How figures are reported (story-figures.ts DEFAULT_DECIMALS) and drawn curves' decimals. */
  rounding: { decimals: Record<FigureUnit, number>, curvePlaces: number }
}

/** An edition as the desk sees it in the story's history. */
export interface StoryEditionSummary {
  id: number
  storyId: number
  /** 1, 2, 3 ... per story. */
  number: number
  /** sha256 of the canonical JSON of the data (hex). */
  contentHash: string
  approvedBy: { userId: number, displayName: string } | null
  approvedAt: string
  publishedAt: string | null
  /** Empty for the first edition; what a corrected edition changed, in the editor's words. */
  correctionNote: string
}

/** One figure whose value moved between two sets of data (old and new as readers would see them). */
export interface MovedFigure { label: string, figure: string, old: string, new: string }

/** GET /api/stories/:id/edition: the edition in force and whether the workspace moved since. */
export interface StoryEditionStatus {
  /** The newest approved edition; null before the first approval. */
  current: StoryEditionSummary | null
  /** The edition readers see; null when nothing is published. */
  published: StoryEditionSummary | null
  /** True when the workspace data the story uses is not the current edition's any more. */
  dataChanged: boolean
  /** The text (headline, deck or body) differs from the current edition's. */
  textChanged: boolean
  /** Figures whose value moves from the current edition to the live data. */
  moved: MovedFigure[]
  editions: StoryEditionSummary[]
}
