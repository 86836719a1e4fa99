import { z } from 'zod'
import { ROLES, type Role } from './roles'

export const RoleSchema = z.enum(ROLES)

/** The signed-in user as the interface sees it (GET /api/auth/me). */
export interface CurrentUser {
  id: number
  email: string
  displayName: string
  role: Role
}

/** A row of the admin's user list (GET /api/users). */
export interface UserRow extends CurrentUser {
  disabled: boolean
  /** Invited and has not chosen a password yet: cannot sign in until they do. */
  invited: boolean
  createdAt: string
}

export const PASSWORD_MIN = 10

export const EmailSchema = z.string().trim().toLowerCase().max(254).email('Enter a valid e-mail address')
export const PasswordSchema = z.string().min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters`).max(200, 'Use at most 200 characters')
export const DisplayNameSchema = z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters')

export const LoginBody = z.object({ email: z.string().trim().toLowerCase().max(254), password: z.string().max(200) })
export const RegisterBody = z.object({ email: EmailSchema, displayName: DisplayNameSchema })
export const PasswordChangeBody = z.object({ currentPassword: z.string().max(200), newPassword: PasswordSchema })
export const ResetRequestBody = z.object({ email: z.string().trim().toLowerCase().max(254) })
export const ResetConfirmBody = z.object({ token: z.string().min(20).max(200), password: PasswordSchema })
/** Without a password the new user gets an invitation e-mail to set one. */
export const CreateUserBody = z.object({ email: EmailSchema, displayName: DisplayNameSchema, role: RoleSchema, password: PasswordSchema.optional() })
export const UpdateUserBody = z.object({ role: RoleSchema.optional(), disabled: z.boolean().optional(), displayName: DisplayNameSchema.optional() })
  .refine(b => Object.keys(b).length > 0, 'Nothing to change')

/** Validation failures from the API: HTTP 400 with this as `data`. */
export interface FieldIssue { path: string, message: string }
export interface ValidationErrorData { issues: FieldIssue[] }
