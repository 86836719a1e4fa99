// The stories and desk API contract: every DTO the story editor, the desk and the
// preview page read, and every request body as a zod schema shared by the server
// handlers and the forms. Routes and statuses: docs/api/stories.md.
// Times are UTC ISO 8601 strings; the interface shows them in the site's and the user's zone.
import { z } from 'zod'
import type { EngineFamily, PartType } from './catalog'
import { EngineFamilySchema, PartTypeSchema } from './catalog-schemas'
import type { Role } from './roles'
import { StoryActionSchema, StoryStateSchema, type StoryAction, type StoryGuard, type StoryState } from './story-workflow'
import type { FigureComparison, FigureUnit, InlineFigureKey } from './story-figures'
import type { AnalysisResponse } from './analysis-results'
import type { BuildSheet } from './build-sheets'
import type { Setup } from './setups'
import type { StaleVersionData } from './workspace'
import type { DayReport } from './dyno-day'
import { bodySafetyIssues } from '../utils/story-body'

// ---------- limits and timing ----------

export const STORY_LIMITS = {
  headline: 200,
  deck: 600,
  body: 200_000,
  searchTitle: 120,
  searchDescription: 320,
  tags: 20,
  tag: 40,
  bylines: 6,
  note: 10_000,
  noteAnchor: 500,
  /** Revisions that are not state changes: the newest this many are kept. */
  keptRevisions: 50,
} as const

/** The editor sends a heartbeat this often; a lock not refreshed for LOCK_EXPIRES_SECONDS is gone. */
export const LOCK_HEARTBEAT_SECONDS = 30
export const LOCK_EXPIRES_SECONDS = 90

export const PREVIEW_LINK_LIMITS = { minHours: 1, maxHours: 30 * 24, defaultHours: 7 * 24 } as const

/** Pages of the app that e-mails and links point to. */
export const STORY_PATHS = {
  editor: (storyId: number) => `/stories/${storyId}/edit`,
  deskStory: (storyId: number) => `/desk/${storyId}`,
  /** The reader's page of a published story. */
  public: (slug: string) => `/stories/${encodeURIComponent(slug)}`,
  desk: () => '/desk',
  preview: (token: string) => `/preview/${token}`,
} as const

// ---------- fields ----------

const trimmed = (max: number, what: string) => z.string().trim().max(max, `Keep ${what} under ${max} characters`)

export const HeadlineSchema = z.string().trim().min(1, 'Enter a headline').max(STORY_LIMITS.headline, `Keep the headline under ${STORY_LIMITS.headline} characters`)
export const DeckSchema = trimmed(STORY_LIMITS.deck, 'the deck')
/** Markdown with figures; markup that could run script is refused (see shared/utils/story-body.ts). */
export const StoryBodySchema = z.string().max(STORY_LIMITS.body, `Keep the body under ${STORY_LIMITS.body} characters`)
  .superRefine((body, ctx) => {
    for (const issue of bodySafetyIssues(body)) ctx.addIssue({ code: 'custom', message: issue.message })
  })
export const SlugSchema = z.string().trim().toLowerCase().min(1, 'Enter a slug')
  .max(120, 'Keep the slug under 120 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lowercase letters, digits and single hyphens')
export const TagSchema = z.string().trim().toLowerCase().min(1, 'A tag needs a word')
  .max(STORY_LIMITS.tag, `Keep a tag under ${STORY_LIMITS.tag} characters`)
  .regex(/^[\p{L}\p{N}][\p{L}\p{N} -]*$/u, 'Tags are words, digits, spaces and hyphens')
export const TagsSchema = z.array(TagSchema).max(STORY_LIMITS.tags, `At most ${STORY_LIMITS.tags} tags`)
  .transform(tags => [...new Set(tags)])
export const SearchTitleSchema = trimmed(STORY_LIMITS.searchTitle, 'the search title')
export const SearchDescriptionSchema = trimmed(STORY_LIMITS.searchDescription, 'the search description')
const UserIdSchema = z.number().int().positive()
export const BylineIdsSchema = z.array(UserIdSchema).min(1, 'A story has at least one byline')
  .max(STORY_LIMITS.bylines, `At most ${STORY_LIMITS.bylines} bylines`)
  .transform(ids => [...new Set(ids)])
const StoryVersionSchema = z.number({ error: 'The version you read is required' }).int().min(1)
const IsoInstant = z.iso.datetime({ offset: true, error: 'Use a time like 2026-05-14T09:00:00Z' })

// ---------- the story ----------

export interface StoryByline { userId: number, displayName: string }

/** Who has the story open in the editor (soft: it warns, it never blocks a save). */
export interface StoryLock {
  userId: number
  displayName: string
  since: string
  heartbeatAt: string
  expiresAt: string
}

/** The fields a revision keeps and a restore puts back. */
export interface StoryContent {
  headline: string
  deck: string
  body: string
  slug: string
  heroPhotoId: number | null
  tags: string[]
  engineFamily: EngineFamily
  partType: PartType
  searchTitle: string
  searchDescription: string
  bylineIds: number[]
}

export interface StorySummary {
  id: number
  benchTestId: number
  benchTestTitle: string
  slug: string
  headline: string
  deck: string
  bylines: StoryByline[]
  heroPhotoId: number | null
  tags: string[]
  engineFamily: EngineFamily
  partType: PartType
  state: StoryState
  scheduledAt: string | null
  publishedAt: string | null
  version: number
  lock: StoryLock | null
  createdAt: string
  updatedAt: string
}

export interface Story extends StorySummary, StoryContent {
  searchTitle: string
  searchDescription: string
  createdBy: StoryByline
  /** The story version an editor last opened the number check for (approval needs the current one). */
  numberCheckSeenVersion: number | null
  /** For the user asking: what they may do now (guards not yet checked) and whether they may edit the text. */
  allowedActions: StoryAction[]
  mayEdit: boolean
}

export interface StoryResponse { story: Story }
export interface StoryListResponse { stories: StorySummary[] }

/** POST /api/stories. Engine family and part type default to the bench test's; bylines to the caller. */
export const CreateStoryBody = z.object({
  benchTestId: z.number({ error: 'Choose a bench test' }).int().positive(),
  headline: HeadlineSchema,
  deck: DeckSchema.optional(),
  body: StoryBodySchema.optional(),
  slug: SlugSchema.optional(),
  tags: TagsSchema.optional(),
  engineFamily: EngineFamilySchema.optional(),
  partType: PartTypeSchema.optional(),
  bylineIds: BylineIdsSchema.optional(),
})
export type CreateStoryInput = z.infer<typeof CreateStoryBody>

/**
 * PATCH /api/stories/:id: the version read plus any fields. `autosave: true` marks
 * a save made while typing: it coalesces into one autosave revision per person
 * instead of adding a revision each time (docs/api/stories.md, "Saving").
 */
export const UpdateStoryBody = z.object({
  version: StoryVersionSchema,
  autosave: z.boolean().optional(),
  headline: HeadlineSchema.optional(),
  deck: DeckSchema.optional(),
  body: StoryBodySchema.optional(),
  slug: SlugSchema.optional(),
  heroPhotoId: z.number().int().positive().nullable().optional(),
  tags: TagsSchema.optional(),
  engineFamily: EngineFamilySchema.optional(),
  partType: PartTypeSchema.optional(),
  searchTitle: SearchTitleSchema.optional(),
  searchDescription: SearchDescriptionSchema.optional(),
  bylineIds: BylineIdsSchema.optional(),
})
export type UpdateStoryInput = z.infer<typeof UpdateStoryBody>

export const StoryListQuery = z.object({
  state: StoryStateSchema.optional(),
  benchTestId: z.coerce.number().int().positive().optional(),
  q: z.string().trim().max(100).optional(),
})

/** 409 of a stale save: the story as it is now (nothing of the refused save was stored). */
export type StoryConflictData = StaleVersionData<Story>

// ---------- workflow ----------

/** POST /api/stories/:id/transitions */
export const TransitionBody = z.object({
  action: StoryActionSchema,
  version: StoryVersionSchema,
  note: z.string().trim().max(STORY_LIMITS.note, `Keep the note under ${STORY_LIMITS.note} characters`).optional(),
  /** For schedule: when it goes live (UTC ISO; an offset is converted). */
  scheduledAt: IsoInstant.optional(),
})
export type TransitionInput = z.infer<typeof TransitionBody>

/** The audit row of one change of state; `by` is null for the publishing job. */
export interface StoryTransition {
  id: number
  storyId: number
  action: StoryAction | 'scheduled_publish'
  fromState: StoryState
  toState: StoryState
  by: { userId: number, displayName: string } | null
  note: string
  scheduledAt: string | null
  at: string
}

export interface TransitionResponse { story: Story, transition: StoryTransition }

/** 422 body (`data`) when a guard refuses a transition. */
export interface GuardRefusalData {
  guard: StoryGuard
  message: string
  /** photos-alt-text: the photos lacking it; figures-valid: the figure problems. */
  photos?: { id: number, originalName: string }[]
  figures?: FigureProblem[]
}

/** 409 body (`data`) when the action does not apply to the story's state. */
export interface WrongStateData { state: StoryState, allowedActions: StoryAction[] }

// ---------- revisions ----------

export const REVISION_KINDS = [
  { id: 'created', label: 'Created' },
  { id: 'save', label: 'Saved' },
  { id: 'autosave', label: 'Autosaved' },
  { id: 'state', label: 'State changed' },
  { id: 'restore', label: 'Restored' },
] as const
export type RevisionKind = typeof REVISION_KINDS[number]['id']

export interface StoryRevisionSummary {
  id: number
  storyId: number
  kind: RevisionKind
  /** The story version this revision holds. */
  storyVersion: number
  state: StoryState
  author: StoryByline | null
  /** For state revisions: the action; for restores: the revision restored ("from revision 12"). */
  note: string
  createdAt: string
  /** Autosaves coalesce: the last time this revision was overwritten. */
  updatedAt: string
}

export interface StoryRevision extends StoryRevisionSummary { content: StoryContent }

export interface RevisionListResponse { revisions: StoryRevisionSummary[] }

/** GET /api/stories/:id/revisions/compare?from=&to= */
export const RevisionCompareQuery = z.object({ from: z.coerce.number().int().positive(), to: z.coerce.number().int().positive() })

export type DiffLine = { kind: 'same' | 'added' | 'removed', text: string }

export interface RevisionComparison {
  from: StoryRevision
  to: StoryRevision
  /** Content fields that differ. */
  changedFields: (keyof StoryContent)[]
  /** The body, line by line (removed = only in `from`, added = only in `to`). */
  bodyDiff: DiffLine[]
}

/** POST /api/stories/:id/revisions/:revisionId/restore */
export const RestoreRevisionBody = z.object({ version: StoryVersionSchema })

// ---------- notes ----------

export interface StoryNote {
  id: number
  storyId: number
  /** null for the first note of a thread. */
  parentId: number | null
  author: { userId: number, displayName: string, role: Role }
  /** Plain text, shown as text (never rendered as HTML or Markdown). */
  body: string
  /** The words of the story the note is about, as quoted by its author. */
  anchor: string
  createdAt: string
  editedAt: string | null
  /** Threads are resolved as a whole; set on the first note only. */
  resolved: boolean
  resolvedBy: StoryByline | null
  resolvedAt: string | null
}

export interface StoryNoteThread extends StoryNote { replies: StoryNote[] }

export interface NoteListResponse { threads: StoryNoteThread[], openThreads: number }

/** POST /api/stories/:id/notes. A reply to a reply joins the thread of its first note. */
export const CreateNoteBody = z.object({
  body: z.string().trim().min(1, 'Write the note').max(STORY_LIMITS.note, `Keep the note under ${STORY_LIMITS.note} characters`),
  parentId: z.number().int().positive().optional(),
  anchor: z.string().trim().max(STORY_LIMITS.noteAnchor, `Quote at most ${STORY_LIMITS.noteAnchor} characters`).optional(),
})

/** PATCH /api/stories/:id/notes/:noteId: resolve or reopen a thread, or (author only) change the text. */
export const UpdateNoteBody = z.object({
  resolved: z.boolean().optional(),
  body: CreateNoteBody.shape.body.optional(),
}).refine(b => b.resolved !== undefined || b.body !== undefined, 'Nothing to change')

// ---------- locks ----------

/** POST /api/stories/:id/lock: take the lock or send a heartbeat; takeOver replaces someone else's live lock. */
export const LockBody = z.object({ takeOver: z.boolean().optional() })

export interface LockResponse {
  /** The lock as it is now (yours or someone else's); null after a release. */
  lock: StoryLock | null
  heldByMe: boolean
}

// ---------- preview links ----------

export interface PreviewLink {
  id: number
  storyId: number
  label: string
  createdBy: StoryByline
  createdAt: string
  expiresAt: string
  revokedAt: string | null
  lastUsedAt: string | null
  state: 'active' | 'expired' | 'revoked'
}

/** POST /api/stories/:id/preview-links */
export const CreatePreviewLinkBody = z.object({
  label: z.string().trim().max(120, 'Keep the label under 120 characters').optional(),
  expiresInHours: z.number().int().min(PREVIEW_LINK_LIMITS.minHours, 'At least 1 hour').max(PREVIEW_LINK_LIMITS.maxHours, 'At most 30 days').optional(),
})

/** The only time the token is shown (only its hash is stored). */
export interface CreatedPreviewLink { link: PreviewLink, url: string, token: string }

// ---------- figures and the reader's view ----------

/** A photo as a story shows it: no original file, no internals. */
export interface StoryPhoto {
  id: number
  caption: string
  credit: string
  altText: string
  width: number
  height: number
  variants: { width: number, height: number, url: string }[]
  ready: boolean
}

/** A figure in the body that cannot be shown as written; line is 1-based in the body. */
export interface FigureProblem { line: number, figure: string, message: string }

/** GET /api/stories/:id/figures: everything the body's figures are drawn from. */
export interface StoryFigures {
  benchTestId: number
  /**
   * All analysed setups against the bench test's baseline, in hp and lb-ft, with the
   * bench test's default correction standard; null when no setup has included pulls yet.
   */
  analysis: AnalysisResponse | null
  /** Why analysis is null, in words fit to show. */
  analysisProblem: string | null
  /** Every ordered pair of analysed setups, for gains against any setup. */
  comparisons: FigureComparison[]
  buildSheet: BuildSheet | null
  /** The test plan against what happened (::day-report); present only when the body shows it, null without a plan. */
  dayReport?: DayReport | null
  /** The story's setups with their parts (cam cards), in order; for the editor every live setup. */
  setups: Setup[]
  /** Editor only: every setup of the bench test, for the figure picker. */
  benchSetups?: { setupId: number, label: string, isBaseline: boolean, analysed: boolean }[]
  /** For the editor: every photo of the bench test; for readers: the photos the story uses. */
  photos: StoryPhoto[]
  /** Problems of the figures in the current body. */
  problems: FigureProblem[]
}

/** The edition a reader's page shows, with every correction published so far (oldest first). */
export interface ReaderEdition {
  number: number
  publishedAt: string | null
  corrections: { number: number, at: string, note: string }[]
}

/** What the reader's page needs, for the preview link (and the public page later). */
export interface StoryReaderView {
  story: {
    id: number
    slug: string
    headline: string
    deck: string
    bylines: StoryByline[]
    body: string
    heroPhoto: StoryPhoto | null
    tags: string[]
    engineFamily: EngineFamily
    partType: PartType
    searchTitle: string
    searchDescription: string
    state: StoryState
    publishedAt: string | null
    updatedAt: string
  }
  benchTest: { id: number, title: string, shop: string, dyno: string, testedFrom: string | null, testedTo: string | null }
  figures: StoryFigures
  /** The published edition the page shows (null on a desk preview or preview link: the live story). */
  edition?: ReaderEdition | null
  /** True on a preview link: the page shows a banner and is not indexed. */
  preview: boolean
}

// ---------- number check ----------

export const CHECKED_UNITS = ['hp', 'lb-ft', 'rpm', 'inHg', '%'] as const satisfies readonly FigureUnit[]

/** A figure the data gives, as reported (rounded). */
export interface FigureCandidate {
  key: InlineFigureKey | 'pull-baro'
  label: string
  value: number
  unit: FigureUnit
  setupId: number
  vsSetupId: number | null
  withinRepeatability: boolean | null
}

/** One number of the prose with a unit, and what the data says about it. */
export interface NumberFinding {
  /** The number as written, with its unit ("35 hp"). */
  text: string
  value: number
  unit: FigureUnit
  /** 1-based line of the body. */
  line: number
  /** The figure it agrees with, when one does. */
  matched?: { label: string, value: number, withinRepeatability: boolean | null }
  /** The closest figures of the same unit, nearest first (at most 3). */
  nearest: { label: string, value: number, unit: FigureUnit }[]
  /** Sentence fit to show: "text says 35 hp; the data gives 31.4 hp (peak-to-peak power gain ...)". */
  message: string
}

export interface NumberCheckResult {
  storyId: number
  /** The story version checked. Opening it as an editor records it as seen for this version. */
  storyVersion: number
  checkedAt: string
  findings: NumberFinding[]
  /** How many findings agree with no figure. */
  flagged: number
  /** null when the bench test has no analysed pulls (then every number is flagged). */
  analysisProblem: string | null
  seenRecorded: boolean
}

// ---------- the desk and the writer's list ----------

export const DeskQueueQuery = z.object({
  state: z.enum(['in_review', 'changes_requested', 'approved', 'scheduled']).optional(),
})

export interface DeskQueueItem {
  story: StorySummary
  /** When it entered the state (for in_review: when it was sent), and since how long. */
  since: string
  ageSeconds: number
  submittedBy: StoryByline | null
  openThreads: number
}

export interface DeskQueueResponse { state: StoryState, items: DeskQueueItem[] }

export const MyStoriesQuery = z.object({
  state: StoryStateSchema.optional(),
})

export interface MyStoriesResponse { stories: StorySummary[], counts: Record<StoryState, number> }

export interface TransitionListResponse { transitions: StoryTransition[] }
