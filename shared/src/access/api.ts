import { z } from 'zod';
import { actionSchema } from './actions.js';
import { PASSWORD_RULES } from './password.js';
import { rolesSchema } from './roles.js';

/** Request and response shapes of /api/auth and /api/users, shared by the gateway and the console. */

/** The refresh token's cookie: httpOnly, SameSite=Strict, sent only to this path. */
export const REFRESH_COOKIE = 'stillwell_refresh';
export const REFRESH_COOKIE_PATH = '/api/auth';

/** Lower-case letters, digits, '.', '_', '-'; 2 to 64 characters; stored lower-case. */
export const usernameSchema = z
  .string()
  .trim()
  .toLowerCase()
  .regex(/^[a-z0-9][a-z0-9._-]{1,63}$/, "2-64 characters: letters, digits, '.', '_' or '-'");
export const displayNameSchema = z.string().trim().min(1).max(100);
export const totpCodeSchema = z.string().regex(/^\d{6}$/, 'six digits');
/** A password as typed at sign-in: the rules apply when it is set, not here. */
const typedPasswordSchema = z
  .string()
  .min(1)
  .max(PASSWORD_RULES.maxLength * 4);
const isoTime = z.string().datetime();

export const signInRequestSchema = z.strictObject({
  username: z.string().min(1).max(128),
  password: typedPasswordSchema,
  /** required when the account has a second factor (the answer says totp-required) */
  totp: totpCodeSchema.optional(),
});
export type SignInRequest = z.infer<typeof signInRequestSchema>;

/** Who is signed in, what they may do, and the state of their session. */
export const meSchema = z.strictObject({
  id: z.string(),
  username: z.string(),
  displayName: z.string(),
  roles: rolesSchema,
  permissions: z.array(actionSchema),
  sessionId: z.string(),
  /** step-up is valid until then (ISO); null when not stepped up or expired */
  stepUpUntil: isoTime.nullable(),
  totpEnabled: z.boolean(),
  /** after an administrator's reset: only the sessions.own routes answer until it is changed */
  mustChangePassword: z.boolean(),
});
export type Me = z.infer<typeof meSchema>;

/** Sign-in and refresh: a short-lived bearer token (the refresh token is in the cookie). */
export const tokenResponseSchema = z.strictObject({
  accessToken: z.string(),
  expiresAt: isoTime,
  me: meSchema,
});
export type TokenResponse = z.infer<typeof tokenResponseSchema>;

export const updateMeRequestSchema = z.strictObject({ displayName: displayNameSchema });
export type UpdateMeRequest = z.infer<typeof updateMeRequestSchema>;

export const stepUpRequestSchema = z.strictObject({
  password: typedPasswordSchema,
  totp: totpCodeSchema.optional(),
});
export type StepUpRequest = z.infer<typeof stepUpRequestSchema>;
export const stepUpResponseSchema = z.strictObject({ stepUpUntil: isoTime });
export type StepUpResponse = z.infer<typeof stepUpResponseSchema>;

export const changePasswordRequestSchema = z.strictObject({
  currentPassword: typedPasswordSchema,
  newPassword: z
    .string()
    .min(1)
    .max(PASSWORD_RULES.maxLength * 4),
});
export type ChangePasswordRequest = z.infer<typeof changePasswordRequestSchema>;

export const sessionSchema = z.strictObject({
  id: z.string(),
  createdAt: isoTime,
  lastRefreshedAt: isoTime,
  expiresAt: isoTime,
  userAgent: z.string().nullable(),
  ip: z.string().nullable(),
  /** the session this request came from */
  current: z.boolean(),
});
export type SessionInfo = z.infer<typeof sessionSchema>;

export const totpBeginResponseSchema = z.strictObject({
  /** base32, for typing into an authenticator by hand */
  secret: z.string(),
  /** otpauth:// URI, as the QR code holds it */
  uri: z.string(),
  /** data:image/png;base64,... */
  qrDataUrl: z.string(),
  algorithm: z.literal('SHA1'),
  digits: z.literal(6),
  period: z.literal(30),
});
export type TotpBeginResponse = z.infer<typeof totpBeginResponseSchema>;
export const totpCodeRequestSchema = z.strictObject({ code: totpCodeSchema });
export type TotpCodeRequest = z.infer<typeof totpCodeRequestSchema>;

/** An account as an administrator sees it. */
export const userSchema = z.strictObject({
  id: z.string(),
  username: z.string(),
  displayName: z.string(),
  roles: rolesSchema,
  disabled: z.boolean(),
  totpEnabled: z.boolean(),
  mustChangePassword: z.boolean(),
  createdAt: isoTime,
  updatedAt: isoTime,
  passwordChangedAt: isoTime,
});
export type User = z.infer<typeof userSchema>;

export const createUserRequestSchema = z.strictObject({
  username: usernameSchema,
  displayName: displayNameSchema,
  roles: rolesSchema,
});
export type CreateUserRequest = z.infer<typeof createUserRequestSchema>;
/** The temporary password is shown once; the user must change it at first sign-in. */
export const createUserResponseSchema = z.strictObject({
  user: userSchema,
  temporaryPassword: z.string(),
});
export type CreateUserResponse = z.infer<typeof createUserResponseSchema>;

export const updateUserRequestSchema = z
  .strictObject({
    displayName: displayNameSchema.optional(),
    roles: rolesSchema.optional(),
    /** true ends every session of the user at once */
    disabled: z.boolean().optional(),
  })
  .refine((b) => Object.values(b).some((v) => v !== undefined), 'nothing to change');
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;

export const resetPasswordRequestSchema = z.strictObject({
  /** also remove the second factor (a lost authenticator) */
  removeTotp: z.boolean().optional(),
});
export type ResetPasswordRequest = z.infer<typeof resetPasswordRequestSchema>;
export const resetPasswordResponseSchema = z.strictObject({ temporaryPassword: z.string() });
export type ResetPasswordResponse = z.infer<typeof resetPasswordResponseSchema>;
