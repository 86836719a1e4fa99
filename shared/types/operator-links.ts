// Operator upload links: the writer's side and the operator's page (docs/api/workspace.md).
import { z } from 'zod'
import { text } from '../workspace/fields'
import { OPERATOR_LINK_LIMITS } from './workspace'

export const OPERATOR_LINK_STATES = ['active', 'expired', 'revoked', 'used-up'] as const
export type OperatorLinkState = typeof OPERATOR_LINK_STATES[number]

export interface OperatorLink {
  id: number
  benchTestId: number
  label: string
  createdAt: string
  createdByName: string
  expiresAt: string
  revokedAt: string | null
  maxFiles: number
  maxFileBytes: number
  filesReceived: number
  state: OperatorLinkState
}

/** POST /api/bench-tests/:id/operator-links */
export const CreateOperatorLinkBody = z.object({
  label: text(120, 'the label').optional(),
  expiresInHours: z.number({ error: 'Choose how long the link works' }).int().min(OPERATOR_LINK_LIMITS.minHours, 'At least 1 hour').max(OPERATOR_LINK_LIMITS.maxHours, 'At most 14 days'),
  maxFiles: z.number().int().min(1).max(OPERATOR_LINK_LIMITS.maxMaxFiles).optional(),
})
export type CreateOperatorLinkInput = z.infer<typeof CreateOperatorLinkBody>

/** The only time the token is shown: the link to hand to the operator. */
export interface CreatedOperatorLink { link: OperatorLink, url: string, token: string }

/** GET /api/upload/:token: all the link reveals. */
export interface UploadLinkInfo {
  benchTestTitle: string
  expiresAt: string
  maxFileBytes: number
  filesLeft: number
  rate: { files: number, minutes: number }
}

export interface UploadReceipt {
  /** filedTo: the setup the file became a pull of, during a dyno day (else it waits in the inbox). */
  received: { name: string, sizeBytes: number, ok: boolean, problemCount: number, filedTo?: string }[]
  filesLeft: number
}
