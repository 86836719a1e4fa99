// What the reader's pages get from /api/magazine (server/services/magazine/lists.ts).
import { z } from 'zod'
import type { CorrectionStandard } from '../dyno/index'
import type { EngineFamily, PartType } from './catalog'
import type { StoryPhoto, StoryReaderView } from './stories'
import { ANALYSIS_UNITS, type AnalysisUnits } from './analysis'
import { CorrectionStandardSchema } from './workspace'

export interface MagazineStoryCard {
  slug: string
  headline: string
  deck: string
  bylines: string[]
  publishedAt: string
  engineFamily: { id: EngineFamily, label: string }
  partType: { id: PartType, label: string }
  tags: string[]
  hero: StoryPhoto | null
}

export interface MagazinePage {
  stories: MagazineStoryCard[]
  page: number
  pageSize: number
  total: number
  pages: number
}

export interface MagazineHome {
  /** The newest published story that has a hero photo (or the newest of all). */
  featured: MagazineStoryCard | null
  latest: MagazineStoryCard[]
  engineFamilies: { id: EngineFamily, label: string, count: number }[]
  partTypes: { id: PartType, label: string, count: number }[]
  tags: { tag: string, count: number }[]
}

/** PATCH /api/preferences: what a reader's graphs remember; null = as the story chose. */
export const ReaderPreferencesBody = z.object({
  units: z.enum(ANALYSIS_UNITS.map(u => u.id) as [AnalysisUnits, ...AnalysisUnits[]]).nullable().optional(),
  standard: CorrectionStandardSchema.nullable().optional(),
})

export interface ReaderPreferences { units: AnalysisUnits | null, standard: CorrectionStandard | null }

/** GET /api/magazine/stories/:slug: the reader's view and where the story lives. */
export interface MagazineStoryResponse extends StoryReaderView {
  canonicalUrl: string
  siteUrl: string
  /**
   * Set on the view a story page is server-rendered from: its drawn curves carry only
   * every this many rpm (shared/utils/page-curves.ts); a live graph fetches the full ones.
   */
  curvesStepRpm?: number
}
