// Accounts, sessions, organisations, memberships and invitations: the shapes both apps, the
// API and the tests agree on.
import { z } from 'zod';

export const ROLES = ['owner', 'technician', 'partner_admin', 'network_admin'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

/** Roles a membership of a partner organisation can carry. */
export const MEMBER_ROLES = ['partner_admin', 'technician'] as const;
export const MemberRoleSchema = z.enum(MEMBER_ROLES);
export type MemberRole = z.infer<typeof MemberRoleSchema>;

/**
 * Whether these roles see every booking of an organisation. A booking carries the customer's
 * name, e-mail, phone and address, so only partner admins and network admins see them all;
 * anyone else (a technician) sees the jobs assigned to them.
 */
export const seesAllOrganisationBookings = (roles: readonly Role[]): boolean => roles.includes('partner_admin') || roles.includes('network_admin');

export const ORGANISATION_STATUSES = ['draft', 'submitted', 'in_review', 'changes_requested', 'approved', 'rejected', 'suspended'] as const;
export const OrganisationStatusSchema = z.enum(ORGANISATION_STATUSES);
export type OrganisationStatus = z.infer<typeof OrganisationStatusSchema>;

export const IdSchema = z.uuid('Not a valid id');

/** An e-mail address, lower-cased; `missing` says whose address is asked for when none is given. */
const emailSchema = (missing: string) =>
  z
    .string({ error: missing })
    .trim()
    .min(1, missing)
    .max(254, 'An e-mail address has at most 254 characters')
    .pipe(z.email('Enter a valid e-mail address'))
    .transform((e) => e.toLowerCase());

export const EmailSchema = emailSchema('Enter your e-mail address');
/** The address of someone being invited: not the inviter's own. */
export const InviteeEmailSchema = emailSchema('Enter the e-mail address of the person you are inviting');

/**
 * A short list of the most common passwords (taken from widely published breach top lists).
 * The check compares case-insensitively and ignores trailing digits and punctuation.
 */
export const COMMON_PASSWORDS: readonly string[] = [
  'password', 'passwort', 'qwertyuiop', 'qwertzuiop', 'asdfghjkl', 'iloveyou', 'sunshine', 'princess', 'football',
  'baseball', 'welcome', 'letmein', 'monkey', 'dragon', 'master', 'superman', 'trustno', 'starwars', 'whatever',
  'admin', 'administrator', 'changeme', 'secret', 'abcdefghij', 'abcdefg', 'qwerty', 'azerty', 'passw0rd', 'p@ssw0rd',
  'hallo', 'sommer', 'winter', 'emberline',
];

const isCommonPassword = (password: string): boolean => {
  const core = password.toLowerCase().replace(/[\d\W_]+$/u, '').replace(/^[\d\W_]+/u, '');
  if (/^(\d)\1*$/.test(password) || /^(0123456789|1234567890|9876543210)/.test(password)) return true;
  if (/^(.)\1+$/u.test(password)) return true;
  return core.length === 0 || COMMON_PASSWORDS.includes(core);
};

export const PASSWORD_MIN_LENGTH = 10;

/** Password rules: at least 10 characters, at most 128, not a common one. The e-mail check is in `withPasswordRules`. */
export const PasswordSchema = z
  .string({ error: 'Choose a password' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(128, 'Use at most 128 characters')
  .refine((p) => !isCommonPassword(p), 'This password is too common: choose one that is harder to guess');

export const PASSWORD_IS_EMAIL_MESSAGE = 'Your password must not be your e-mail address';

/** True when the password is the e-mail address or its local part (case-insensitive). */
export function passwordMatchesEmail(email: string, password: string): boolean {
  const lower = password.toLowerCase();
  const address = email.toLowerCase();
  return lower === address || lower === address.split('@')[0];
}

/** Every password rule for a given address, as messages; empty when the password is acceptable. */
export function passwordProblems(email: string, password: string): string[] {
  const parsed = PasswordSchema.safeParse(password);
  if (!parsed.success) return parsed.error.issues.map((i) => i.message);
  return passwordMatchesEmail(email, password) ? [PASSWORD_IS_EMAIL_MESSAGE] : [];
}

/** Adds the rule "password is not the e-mail address" to a schema with `email` and `password`. */
function withPasswordRules<T extends z.ZodObject<{ email: typeof EmailSchema; password: typeof PasswordSchema }>>(schema: T) {
  return schema.superRefine((v, ctx) => {
    const { email, password } = v as { email: string; password: string };
    if (passwordMatchesEmail(email, password)) ctx.addIssue({ code: 'custom', path: ['password'], message: PASSWORD_IS_EMAIL_MESSAGE });
  });
}

export const NameSchema = z.string().trim().min(1, 'Enter your name').max(120, 'Use at most 120 characters');
export const LocaleSchema = z.enum(['en', 'de']).default('en');

/** The longest return address an app carries through sign-in, sign-up and the e-mail link. */
export const RETURN_PATH_MAX = 1000;

/**
 * Whether a return address is a path inside the same app, so following it never leaves the site:
 * one leading slash (not "//" or "/\\", which browsers read as another host), no backslashes,
 * spaces or control characters, and resolving it against any origin keeps that origin.
 */
export function isSafeReturnPath(value: unknown): value is string {
  if (typeof value !== 'string' || value.length > RETURN_PATH_MAX || !value.startsWith('/')) return false;
  if (value.startsWith('//') || /[\\\s]/.test(value) || /\p{Cc}/u.test(value)) return false;
  try {
    return new URL(value, 'https://return.invalid').origin === 'https://return.invalid';
  } catch {
    return false;
  }
}

export const ReturnPathSchema = z
  .string()
  .max(RETURN_PATH_MAX, `Use at most ${RETURN_PATH_MAX} characters`)
  .refine(isSafeReturnPath, 'Must be a path inside this site, starting with one "/"')
  .describe('Where the app goes on after the e-mail address is confirmed: a path inside the same app');

export const OwnerSignUpSchema = withPasswordRules(
  z.object({ name: NameSchema, email: EmailSchema, password: PasswordSchema, locale: LocaleSchema, returnTo: ReturnPathSchema.optional() }),
);
export type OwnerSignUp = z.input<typeof OwnerSignUpSchema>;

export const PartnerSignUpSchema = withPasswordRules(
  z.object({
    name: NameSchema,
    email: EmailSchema,
    password: PasswordSchema,
    locale: LocaleSchema,
    organisationName: z.string().trim().min(2, 'Enter the name of your business').max(120, 'Use at most 120 characters'),
  }),
);
export type PartnerSignUp = z.input<typeof PartnerSignUpSchema>;

export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'Enter your password').max(128, 'Use at most 128 characters'),
});
export type SignIn = z.input<typeof SignInSchema>;

export const TokenSchema = z.string().min(20, 'This link is incomplete').max(200, 'This link is not valid');
export const VerifyEmailSchema = z.object({ token: TokenSchema });
export const ForgotPasswordSchema = z.object({ email: EmailSchema, app: z.enum(['directory', 'console']).default('directory') });
export const ResetPasswordSchema = z.object({ token: TokenSchema, password: PasswordSchema });
export type ResetPassword = z.input<typeof ResetPasswordSchema>;

export const MembershipSchema = z.object({
  organisationId: IdSchema,
  organisationName: z.string(),
  organisationStatus: OrganisationStatusSchema,
  role: MemberRoleSchema,
});
export type Membership = z.infer<typeof MembershipSchema>;

export const MeSchema = z.object({
  id: IdSchema,
  email: z.string(),
  name: z.string(),
  locale: z.enum(['en', 'de']),
  emailVerified: z.boolean(),
  /** Platform-wide roles: `owner` and/or `network_admin`. Organisation roles are in memberships. */
  roles: z.array(RoleSchema),
  memberships: z.array(MembershipSchema),
});
export type Me = z.infer<typeof MeSchema>;

export const SessionSchema = z.object({
  accessToken: z.string(),
  /** Seconds until the access token expires. */
  expiresIn: z.number().int().positive(),
  user: MeSchema,
});
export type Session = z.infer<typeof SessionSchema>;
export const SessionResponseSchema = z.object({ data: SessionSchema });
export const MeResponseSchema = z.object({ data: MeSchema });

/** The same answer whatever happened, so nobody can learn which e-mail addresses have accounts. */
export const AcceptedSchema = z.object({ data: z.object({ accepted: z.literal(true), message: z.string() }) });

export const UpdateAccountSchema = z.object({ name: NameSchema.optional(), locale: z.enum(['en', 'de']).optional() });

export const InviteSchema = z.object({ email: InviteeEmailSchema, role: MemberRoleSchema });
export type Invite = z.input<typeof InviteSchema>;

export const InvitationSchema = z.object({
  id: IdSchema,
  email: z.string(),
  role: MemberRoleSchema,
  invitedBy: z.string(),
  createdAt: z.string(),
  expiresAt: z.string(),
});
export type Invitation = z.infer<typeof InvitationSchema>;

/** What someone who opens an invitation link sees before accepting. */
export const InvitationPreviewSchema = z.object({
  organisationName: z.string(),
  role: MemberRoleSchema,
  email: z.string(),
  accountExists: z.boolean(),
});
export type InvitationPreview = z.infer<typeof InvitationPreviewSchema>;

/** Accepting: a new account gives name and password; an existing one signs in with its password. */
export const AcceptInvitationSchema = z.object({
  token: TokenSchema,
  name: NameSchema.optional(),
  password: z.string().min(1, 'Enter a password').max(128, 'Use at most 128 characters'),
});
export type AcceptInvitation = z.input<typeof AcceptInvitationSchema>;

export const TeamMemberSchema = z.object({
  userId: IdSchema,
  name: z.string(),
  email: z.string(),
  role: MemberRoleSchema,
  joinedAt: z.string(),
});
export type TeamMember = z.infer<typeof TeamMemberSchema>;

export const TeamSchema = z.object({ members: z.array(TeamMemberSchema), invitations: z.array(InvitationSchema) });
export type Team = z.infer<typeof TeamSchema>;

export const ChangeRoleSchema = z.object({ role: MemberRoleSchema });

export const MAIL_STATUSES = ['pending', 'sent', 'failed'] as const;
export const MailLogEntrySchema = z.object({
  id: IdSchema,
  to: z.string(),
  subject: z.string(),
  template: z.string(),
  status: z.enum(MAIL_STATUSES),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  text: z.string(),
  html: z.string(),
});
export type MailLogEntry = z.infer<typeof MailLogEntrySchema>;

export const OrganisationSummarySchema = z.object({
  id: IdSchema,
  name: z.string(),
  status: OrganisationStatusSchema,
  statusReason: z.string().nullable(),
  members: z.number().int(),
  createdAt: z.string(),
});
export type OrganisationSummary = z.infer<typeof OrganisationSummarySchema>;

export const AuditEntrySchema = z.object({
  id: z.string(),
  actorUserId: z.string().nullable(),
  /** The actor's name as it is now; null for the system or a deleted account. */
  actorName: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  organisationId: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
  createdAt: z.string(),
});
export type AuditEntry = z.infer<typeof AuditEntrySchema>;
