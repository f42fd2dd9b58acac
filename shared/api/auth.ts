/**
 * Request and response bodies of the accounts API: sign-in, tokens, the caller's profile,
 * invitations, password resets and the admin's members screen. The client's forms use the same
 * schemas, so a field error reads the same in the browser and from the server.
 */
import { z } from 'zod';
import { RoleSchema } from './roles';

/** bcrypt reads at most 72 bytes of a password; anything longer would be silently cut, so refuse it. */
export const PASSWORD_MAX_BYTES = 72;
export const PASSWORD_MIN_LENGTH = 10;

export const utf8Length = (s: string): number => new TextEncoder().encode(s).length;

const tooLongMessage =
  'This password is too long: use at most 72 bytes (72 plain letters and digits, fewer with accents or symbols).';

export const EmailSchema = z
  .string()
  .trim()
  .min(1, 'Enter an e-mail address.')
  .max(254, 'This e-mail address is too long.')
  .toLowerCase()
  .pipe(z.email('Enter an e-mail address like name@firm.com.'));

/** A password someone chooses (invitation, reset). */
export const NewPasswordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .refine((s) => utf8Length(s) <= PASSWORD_MAX_BYTES, tooLongMessage);

export const PersonNameSchema = z.string().trim().min(1, 'Enter a name.').max(120, 'Use at most 120 characters.');

export const UnitSystemSchema = z.enum(['si', 'us']);
export type UnitSystem = z.infer<typeof UnitSystemSchema>;

export const SignInRequestSchema = z.object({
  email: EmailSchema,
  password: z
    .string()
    .min(1, 'Enter your password.')
    .refine((s) => utf8Length(s) <= PASSWORD_MAX_BYTES, tooLongMessage),
});
export type SignInRequest = z.infer<typeof SignInRequestSchema>;

export const MembershipStatusSchema = z.enum(['active', 'invited', 'deactivated']);
export type MembershipStatus = z.infer<typeof MembershipStatusSchema>;

/** The signed-in person as the client keeps it (also remembered on the device for offline use). */
export const MeSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  email: z.string(),
  role: RoleSchema,
  unitSystem: UnitSystemSchema,
  organisation: z.object({ id: z.uuid(), name: z.string() }),
});
export type Me = z.infer<typeof MeSchema>;

export const SessionResponseSchema = z.object({
  accessToken: z.string(),
  /** Seconds until the access token expires. */
  expiresIn: z.number().int().positive(),
  user: MeSchema,
});
export type SessionResponse = z.infer<typeof SessionResponseSchema>;

export const UpdateMeRequestSchema = z
  .object({ name: PersonNameSchema.optional(), unitSystem: UnitSystemSchema.optional() })
  .refine((v) => v.name !== undefined || v.unitSystem !== undefined, 'Change the name or the unit system.');
export type UpdateMeRequest = z.infer<typeof UpdateMeRequestSchema>;

export const ForgotPasswordRequestSchema = z.object({ email: EmailSchema });
export type ForgotPasswordRequest = z.infer<typeof ForgotPasswordRequestSchema>;

export const MessageResponseSchema = z.object({ message: z.string() });
export type MessageResponse = z.infer<typeof MessageResponseSchema>;

/** Tokens sent by e-mail: 32 random bytes, base64url. */
export const EmailTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'This link is not valid.');

export const ResetPasswordRequestSchema = z.object({ token: EmailTokenSchema, password: NewPasswordSchema });
export type ResetPasswordRequest = z.infer<typeof ResetPasswordRequestSchema>;

export const InvitationInfoSchema = z.object({
  email: z.string(),
  role: RoleSchema,
  organisation: z.object({ name: z.string() }),
  invitedBy: z.object({ name: z.string() }).nullable(),
  expiresAt: z.string(),
});
export type InvitationInfo = z.infer<typeof InvitationInfoSchema>;

export const AcceptInvitationRequestSchema = z.object({ name: PersonNameSchema, password: NewPasswordSchema });
export type AcceptInvitationRequest = z.infer<typeof AcceptInvitationRequestSchema>;

// ---- members (admin) -------------------------------------------------------------------------

export const MemberSchema = z.object({
  userId: z.uuid(),
  name: z.string(),
  email: z.string(),
  role: RoleSchema,
  status: MembershipStatusSchema,
  lastSignInAt: z.string().nullable(),
  /** When the latest invitation expires, for members still invited. */
  invitationExpiresAt: z.string().nullable(),
});
export type Member = z.infer<typeof MemberSchema>;

export const MembersResponseSchema = z.object({ members: z.array(MemberSchema) });
export type MembersResponse = z.infer<typeof MembersResponseSchema>;

export const InviteMemberRequestSchema = z.object({ email: EmailSchema, role: RoleSchema });
export type InviteMemberRequest = z.infer<typeof InviteMemberRequestSchema>;

export const ChangeRoleRequestSchema = z.object({ role: RoleSchema });
export type ChangeRoleRequest = z.infer<typeof ChangeRoleRequestSchema>;

export { ROLE_LABELS } from './role-labels';
