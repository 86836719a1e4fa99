// The inbox of files operators sent, waiting for the writer (docs/api/workspace.md).
import { z } from 'zod'
import { weatherUnlessCorrected } from '../workspace/fields'
import { PullAssignment, type PullFilePreview } from './pull-imports'
import { ColumnMappingSchema, PULL_LIMITS } from './workspace'

export const INBOX_STATES = ['waiting', 'assigned', 'dismissed'] as const
export type InboxState = typeof INBOX_STATES[number]

export interface InboxFile {
  id: number
  benchTestId: number
  fileName: string
  sizeBytes: number
  receivedAt: string
  link: { id: number, label: string }
  state: InboxState
  assignedPullId: number | null
  preview: PullFilePreview
}

export const InboxListQuery = z.object({ state: z.enum(INBOX_STATES).optional() })

/** POST /api/bench-tests/:id/inbox/assign: every item in one transaction, through the import path. */
export const AssignInboxBody = z.object({
  items: z.array(PullAssignment.extend({
    fileId: z.number().int().positive(),
    mapping: ColumnMappingSchema.optional(),
  }).refine(f => f.weather !== null || f.dynoCorrected === true, weatherUnlessCorrected)).min(1).max(PULL_LIMITS.maxFilesPerBatch),
})
export type AssignInboxInput = z.infer<typeof AssignInboxBody>

/** POST /api/bench-tests/:id/inbox/:fileId/preview: the stored file parsed again with a mapping. */
export const InboxPreviewBody = z.object({ mapping: ColumnMappingSchema.optional() })
