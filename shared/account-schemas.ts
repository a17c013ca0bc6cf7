/**
 * Requests and answers of accounts and workshops, shared by the forms and the API so both
 * validate with the same rules and the same words.
 */
import * as z from 'zod';

export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 256;
export const ROLES = ['owner', 'builder', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const emailSchema = z
  .string({ error: 'E-mail is required' })
  .trim()
  .toLowerCase()
  .max(254, { error: 'E-mail must be at most 254 characters' })
  .pipe(z.email({ error: 'Type an e-mail address like name@example.org' }));

export const newPasswordSchema = z
  .string({ error: 'Password is required' })
  .min(MIN_PASSWORD_LENGTH, { error: `Password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  .max(MAX_PASSWORD_LENGTH, { error: `Password must be at most ${MAX_PASSWORD_LENGTH} characters` });

const displayNameSchema = z
  .string({ error: 'Name is required' })
  .trim()
  .min(1, { error: 'Name is required' })
  .max(80, { error: 'Name must be at most 80 characters' });

const tokenSchema = z
  .string({ error: 'The link is incomplete' })
  .trim()
  .regex(/^[A-Za-z0-9_-]{20,128}$/, { error: 'The link is incomplete or mistyped' });

export const workshopNameSchema = z
  .string({ error: 'Workshop name is required' })
  .trim()
  .min(1, { error: 'Workshop name is required' })
  .max(80, { error: 'Workshop name must be at most 80 characters' });

export const roleSchema = z.enum(ROLES, { error: 'Role must be owner, builder or viewer' });

export const signUpRequestSchema = z.object({
  email: emailSchema,
  displayName: displayNameSchema,
  password: newPasswordSchema,
  /** Signing up from an invitation proves the address; the account joins the workshop. */
  invitationToken: tokenSchema.optional(),
});
export const signInRequestSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: 'Password is required' })
    .min(1, { error: 'Password is required' })
    .max(MAX_PASSWORD_LENGTH),
});
export const verifyEmailRequestSchema = z.object({ token: tokenSchema });
export const emailOnlyRequestSchema = z.object({ email: emailSchema });
export const resetPasswordRequestSchema = z.object({ token: tokenSchema, newPassword: newPasswordSchema });
export const changePasswordRequestSchema = z.object({
  currentPassword: z
    .string({ error: 'Current password is required' })
    .min(1, { error: 'Current password is required' }),
  newPassword: newPasswordSchema,
});
export const updateAccountRequestSchema = z.object({ displayName: displayNameSchema });
export const deleteAccountRequestSchema = z.object({
  password: z.string({ error: 'Password is required' }).min(1, { error: 'Password is required' }),
});
export const workshopRequestSchema = z.object({ name: workshopNameSchema });
export const memberRoleRequestSchema = z.object({ role: roleSchema });
export const invitationRequestSchema = z.object({ email: emailSchema, role: roleSchema });

export type SignUpRequest = z.input<typeof signUpRequestSchema>;
export type SignInRequest = z.input<typeof signInRequestSchema>;
export type ResetPasswordRequest = z.input<typeof resetPasswordRequestSchema>;
export type ChangePasswordRequest = z.input<typeof changePasswordRequestSchema>;
export type InvitationRequest = z.input<typeof invitationRequestSchema>;

/** POST /api/auth/sign-up answers 202 with what to do next. */
export interface SignUpAnswer {
  readonly message: string;
  readonly next: 'confirm-email' | 'sign-in';
}

export interface AccountView {
  readonly id: string;
  readonly email: string;
  readonly displayName: string;
  readonly emailVerified: boolean;
}

export interface WorkshopView {
  readonly id: string;
  readonly name: string;
  /** Every account has one personal workshop; it can be renamed and shared like any other. */
  readonly personal: boolean;
  readonly role: Role;
  readonly memberCount: number;
}

export interface MemberView {
  readonly userId: string;
  readonly displayName: string;
  /** Only owners see members' addresses. */
  readonly email?: string;
  readonly role: Role;
  readonly joinedAt: string;
}

export interface InvitationView {
  readonly id: string;
  readonly email: string;
  readonly role: Role;
  readonly invitedBy: string;
  readonly expiresAt: string;
}

export interface InvitationPreview {
  readonly workshopName: string;
  readonly role: Role;
  readonly invitedBy: string;
  readonly email: string;
  readonly expiresAt: string;
}

/** GET /api/account */
export interface SessionView {
  readonly account: AccountView;
  readonly workshops: readonly WorkshopView[];
}

/** Every error the API sends. */
export interface ApiErrorBody {
  readonly error: {
    readonly code: string;
    readonly message: string;
    readonly fields?: Readonly<Record<string, string>>;
    readonly retryAfterMinutes?: number;
  };
}
