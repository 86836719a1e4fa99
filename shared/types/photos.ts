import { z } from 'zod'

/** A photo's life: stored and queued, being sized, ready to use, or given up with a reason. */
export const PHOTO_STATUSES = ['pending', 'processing', 'ready', 'failed'] as const
export type PhotoStatus = typeof PHOTO_STATUSES[number]

/** Web sizes made from every photo (width in px); never larger than the photo itself. */
export const PHOTO_WIDTHS = [480, 960, 1600, 2400] as const
export const PHOTO_JPEG_QUALITY = 82

export const PHOTO_MAX_BYTES = 40 * 1024 * 1024
export const PHOTO_MAX_MEGAPIXELS = 100

/** Decided from the file's bytes, never from its name or the browser's type. */
export const PHOTO_FORMATS = [
  { id: 'jpeg', mime: 'image/jpeg', label: 'JPEG' },
  { id: 'png', mime: 'image/png', label: 'PNG' },
  { id: 'webp', mime: 'image/webp', label: 'WebP' },
] as const
export type PhotoFormat = typeof PHOTO_FORMATS[number]['id']
export type PhotoMime = typeof PHOTO_FORMATS[number]['mime']

export const PHOTO_ACCEPTED_TEXT = 'Accepted: JPEG, PNG and WebP photos up to 40 MB each.'

export interface PhotoVariant {
  width: number
  height: number
  bytes: number
  url: string
}

export interface Photo {
  id: number
  benchTestId: number
  status: PhotoStatus
  /** Why processing gave up, in words fit to show; null unless failed. */
  failureReason: string | null
  originalName: string
  mime: PhotoMime
  bytes: number
  /** As displayed: after the camera's orientation is applied. */
  width: number
  height: number
  sha256: string
  caption: string
  credit: string
  altText: string
  position: number
  isHero: boolean
  version: number
  /** Web sizes, smallest first; empty until ready. */
  variants: PhotoVariant[]
  /** The file as uploaded, for the desk only (never public). */
  originalUrl: string
  uploadedBy: number
  createdAt: string
  updatedAt: string
  processedAt: string | null
}

export interface PhotoUploadResult {
  photo: Photo
  /** True when this bench test already had the same file (same SHA-256): nothing new was stored. */
  duplicate: boolean
}

export interface PhotoGallery {
  benchTest: { id: number, title: string }
  photos: Photo[]
  /** Alt text is required before a story can go to review. */
  missingAltText: PhotoMissingAltText[]
}

export const CaptionSchema = z.string().trim().max(1000, 'Use at most 1000 characters')
export const CreditSchema = z.string().trim().max(200, 'Use at most 200 characters')
export const AltTextSchema = z.string().trim().max(400, 'Use at most 400 characters')

export const PhotoMetaFields = z.object({
  caption: CaptionSchema.optional(),
  credit: CreditSchema.optional(),
  altText: AltTextSchema.optional(),
  /** 0-based place in the gallery; the others move up or down to make room. */
  position: z.number().int().min(0).max(10_000).optional(),
  /** One hero per bench test: setting it clears the others. */
  isHero: z.boolean().optional(),
})

export const UpdatePhotoBody = PhotoMetaFields.extend({ version: z.number().int().positive() })
  .refine(b => Object.keys(b).some(k => k !== 'version'), 'Nothing to change')

/** 409 answer of a stale edit. */
export interface PhotoConflictData { currentVersion: number, current: Photo }

/** Photos of a bench test that still lack alt text (a story needs it before review). */
export interface PhotoMissingAltText { id: number, originalName: string }
