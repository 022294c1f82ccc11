/**
 * The console's account contract: sign-up and sign-in, e-mail links, organizations, members, roles,
 * invitations and the audit log. The server validates requests with these schemas and the console's
 * forms validate with the very same ones. Requests are strict (unknown fields are rejected).
 *
 * Password rules follow NIST SP 800-63B-4 §3.1.1.2 for a single-factor password: at least 15 characters
 * (each Unicode code point counts as one), at least 64 allowed (we allow 256), no composition rules. The
 * check against common and breached passwords needs the shipped list, so it runs on the server only.
 */
import { z } from 'zod';

/** The request header every state-changing console request carries (a CORS-preflighted custom header). */
export const CSRF_HEADER = 'X-Ohmstead-CSRF';
export const CSRF_HEADER_VALUE = '1';

export const roles = ['owner', 'admin', 'developer', 'viewer'] as const;
export type Role = (typeof roles)[number];

export const PASSWORD_MIN_CHARS = 15;
export const PASSWORD_MAX_CHARS = 256;

/** Characters as NIST counts them: Unicode code points, not UTF-16 units. */
export const countCodePoints = (s: string) => [...s].length;

export const RoleSchema = z.enum(roles).meta({
  id: 'MemberRole',
  description:
    'owner: everything, billing, delete the organization, transfer ownership · admin: members, keys, catalog, settings · developer: keys they create, usage, playground, widgets · viewer: read-only.',
  example: 'developer',
});

/** Roles an invitation or a role change may grant; ownership moves only by transfer. */
export const AssignableRoleSchema = z.enum(['admin', 'developer', 'viewer']).meta({
  id: 'AssignableRole',
  description: 'A role that can be given by invitation or role change. Ownership moves only by transfer.',
  example: 'developer',
});

export const EmailSchema = z
  .string()
  .trim()
  .max(254, 'An e-mail address has at most 254 characters')
  .pipe(z.email('Enter an e-mail address such as name@example.com'))
  .meta({ example: 'ada@volt-works.example' });

export const PersonNameSchema = z
  .string()
  .trim()
  .min(1, 'Enter your name')
  .max(100, 'Use at most 100 characters')
  .meta({ example: 'Ada Quill' });

export const OrganizationNameSchema = z
  .string()
  .trim()
  .min(2, 'Use at least 2 characters')
  .max(80, 'Use at most 80 characters')
  .meta({ example: 'Volt Works Outfitters' });

/** A new password: length rules only (the common-password check needs the server's list). */
export const NewPasswordSchema = z
  .string()
  .max(PASSWORD_MAX_CHARS * 4, `Use at most ${PASSWORD_MAX_CHARS} characters`)
  .refine((s) => countCodePoints(s) >= PASSWORD_MIN_CHARS, `Use at least ${PASSWORD_MIN_CHARS} characters (a short phrase works well)`)
  .refine((s) => countCodePoints(s) <= PASSWORD_MAX_CHARS, `Use at most ${PASSWORD_MAX_CHARS} characters`)
  .meta({
    description: `At least ${PASSWORD_MIN_CHARS} characters (Unicode code points), at most ${PASSWORD_MAX_CHARS}; any characters, spaces included; no composition rules. Common and breached passwords are refused.`,
    example: 'granite kettle orbit lantern',
  });

/** A password being checked (sign-in, confirmation): no policy, only a sane size. */
export const CurrentPasswordSchema = z.string().min(1, 'Enter your password').max(PASSWORD_MAX_CHARS * 4);

/** An e-mailed link's token (base64url of 32 random bytes). */
export const LinkTokenSchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9_-]{20,200}$/, 'This link is incomplete: open it again from the e-mail, or copy all of it')
  .meta({ description: 'The token from an e-mailed link (the part after #token=).', example: 'Jc1o6c1U2b3R6b2RnaW5nLXRva2VuLWV4YW1wbGU' });

export const UuidSchema = z.uuid();

// ---------------------------------------------------------------- requests

export const SignUpInputSchema = z
  .strictObject({
    email: EmailSchema,
    name: PersonNameSchema,
    password: NewPasswordSchema,
    organizationName: OrganizationNameSchema.optional().meta({
      description: 'Creates an organization you own. Leave it out when you are joining one by invitation.',
    }),
  })
  .meta({ id: 'SignUpInput' });
export type SignUpInput = z.infer<typeof SignUpInputSchema>;

export const SignInInputSchema = z.strictObject({ email: EmailSchema, password: CurrentPasswordSchema }).meta({ id: 'SignInInput' });
export type SignInInput = z.infer<typeof SignInInputSchema>;

export const EmailInputSchema = z.strictObject({ email: EmailSchema }).meta({ id: 'EmailInput' });
export type EmailInput = z.infer<typeof EmailInputSchema>;

export const TokenInputSchema = z.strictObject({ token: LinkTokenSchema }).meta({ id: 'LinkTokenInput' });
export type TokenInput = z.infer<typeof TokenInputSchema>;

export const ResetPasswordInputSchema = z.strictObject({ token: LinkTokenSchema, password: NewPasswordSchema }).meta({ id: 'ResetPasswordInput' });
export type ResetPasswordInput = z.infer<typeof ResetPasswordInputSchema>;

export const ChangePasswordInputSchema = z
  .strictObject({ currentPassword: CurrentPasswordSchema, newPassword: NewPasswordSchema })
  .meta({ id: 'ChangePasswordInput' });
export type ChangePasswordInput = z.infer<typeof ChangePasswordInputSchema>;

export const UpdateAccountInputSchema = z.strictObject({ name: PersonNameSchema }).meta({ id: 'UpdateAccountInput' });
export type UpdateAccountInput = z.infer<typeof UpdateAccountInputSchema>;

export const SwitchOrganizationInputSchema = z.strictObject({ organizationId: UuidSchema }).meta({ id: 'SwitchOrganizationInput' });
export type SwitchOrganizationInput = z.infer<typeof SwitchOrganizationInputSchema>;

export const CreateOrganizationInputSchema = z.strictObject({ name: OrganizationNameSchema }).meta({ id: 'CreateOrganizationInput' });
export type CreateOrganizationInput = z.infer<typeof CreateOrganizationInputSchema>;

export const UpdateOrganizationInputSchema = z.strictObject({ name: OrganizationNameSchema }).meta({ id: 'UpdateOrganizationInput' });
export type UpdateOrganizationInput = z.infer<typeof UpdateOrganizationInputSchema>;

export const DeleteOrganizationInputSchema = z
  .strictObject({ confirmName: z.string().trim().min(1, "Type the organization's name to confirm").max(80) })
  .meta({ id: 'DeleteOrganizationInput' });
export type DeleteOrganizationInput = z.infer<typeof DeleteOrganizationInputSchema>;

export const TransferOwnershipInputSchema = z.strictObject({ userId: UuidSchema }).meta({ id: 'TransferOwnershipInput' });
export type TransferOwnershipInput = z.infer<typeof TransferOwnershipInputSchema>;

export const UpdateMemberInputSchema = z.strictObject({ role: AssignableRoleSchema }).meta({ id: 'UpdateMemberInput' });
export type UpdateMemberInput = z.infer<typeof UpdateMemberInputSchema>;

export const CreateInvitationInputSchema = z.strictObject({ email: EmailSchema, role: AssignableRoleSchema }).meta({ id: 'CreateInvitationInput' });
export type CreateInvitationInput = z.infer<typeof CreateInvitationInputSchema>;

export const AuditQuerySchema = z
  .strictObject({
    limit: z.coerce.number().int().min(1).max(200).default(50),
    before: z.coerce.number().int().positive().optional().meta({ description: 'Cursor: only events older than this id.' }),
    action: z
      .string()
      .regex(/^[a-z_.]{1,60}$/, 'Use an action name or prefix such as "member." or "auth.sign_in_failed"')
      .optional(),
  })
  .meta({ id: 'AuditQuery' });
export type AuditQuery = z.infer<typeof AuditQuerySchema>;

// ---------------------------------------------------------------- responses

const Timestamp = z.iso.datetime({ offset: true });

export const UserSchema = z
  .object({ id: z.uuid(), email: z.string(), name: z.string(), emailVerified: z.boolean() })
  .meta({ id: 'ConsoleUser' });
export type User = z.infer<typeof UserSchema>;

export const OrganizationSummarySchema = z
  .object({ id: z.uuid(), name: z.string(), slug: z.string(), role: RoleSchema })
  .meta({ id: 'OrganizationMembership', description: 'An organization the signed-in user belongs to, with their role there.' });
export type OrganizationSummary = z.infer<typeof OrganizationSummarySchema>;

export const OrganizationSchema = z
  .object({ id: z.uuid(), name: z.string(), slug: z.string(), planId: z.string(), createdAt: Timestamp, memberCount: z.number().int() })
  .meta({ id: 'Organization' });
export type Organization = z.infer<typeof OrganizationSchema>;

export const SessionInfoSchema = z
  .object({
    user: UserSchema,
    organization: OrganizationSummarySchema.nullable().meta({ description: 'The active organization; null when the user belongs to none.' }),
    organizations: z.array(OrganizationSummarySchema),
    session: z.object({ expiresAt: Timestamp, idleTimeoutMinutes: z.number().int() }),
  })
  .meta({ id: 'SessionInfo', description: 'Who is signed in, the active organization and role, and the other organizations to switch to.' });
export type SessionInfo = z.infer<typeof SessionInfoSchema>;

export const SignUpResultSchema = z
  .object({ user: UserSchema, verificationSentTo: z.string() })
  .meta({ id: 'SignUpResult', description: 'The account exists but is not verified: follow the e-mailed link, then sign in.' });
export type SignUpResult = z.infer<typeof SignUpResultSchema>;

export const AcceptedSchema = z
  .object({ status: z.literal('accepted'), detail: z.string() })
  .meta({ id: 'Accepted', description: 'The request was taken; an e-mail follows when there is something to send.' });
export type Accepted = z.infer<typeof AcceptedSchema>;

export const VerifiedEmailSchema = z.object({ email: z.string(), emailVerified: z.literal(true) }).meta({ id: 'VerifiedEmail' });
export type VerifiedEmail = z.infer<typeof VerifiedEmailSchema>;

export const AccountSessionSchema = z
  .object({ id: z.string(), current: z.boolean(), createdAt: Timestamp, lastSeenAt: Timestamp, expiresAt: Timestamp, ip: z.string().nullable(), userAgent: z.string().nullable() })
  .meta({ id: 'AccountSession', description: 'A signed-in browser.' });
export type AccountSession = z.infer<typeof AccountSessionSchema>;
export const AccountSessionListSchema = z.object({ sessions: z.array(AccountSessionSchema) }).meta({ id: 'AccountSessionList' });

export const MemberSchema = z
  .object({ userId: z.uuid(), email: z.string(), name: z.string(), role: RoleSchema, joinedAt: Timestamp })
  .meta({ id: 'Member' });
export type Member = z.infer<typeof MemberSchema>;
export const MemberListSchema = z.object({ members: z.array(MemberSchema) }).meta({ id: 'MemberList' });
export type MemberList = z.infer<typeof MemberListSchema>;

export const InvitationSchema = z
  .object({
    id: z.uuid(),
    email: z.string(),
    role: RoleSchema,
    status: z.enum(['pending', 'expired']),
    invitedBy: z.object({ name: z.string(), email: z.string() }).nullable(),
    createdAt: Timestamp,
    expiresAt: Timestamp,
  })
  .meta({ id: 'Invitation' });
export type Invitation = z.infer<typeof InvitationSchema>;
export const InvitationListSchema = z.object({ invitations: z.array(InvitationSchema) }).meta({ id: 'InvitationList' });
export type InvitationList = z.infer<typeof InvitationListSchema>;

export const InvitationPreviewSchema = z
  .object({ organizationName: z.string(), email: z.string(), role: RoleSchema, invitedByName: z.string().nullable(), expiresAt: Timestamp })
  .meta({ id: 'InvitationPreview', description: 'What an invitation link offers, shown before it is accepted.' });
export type InvitationPreview = z.infer<typeof InvitationPreviewSchema>;

export const AuditEventSchema = z
  .object({
    id: z.number().int(),
    action: z.string().meta({ example: 'member.role_changed' }),
    actor: z.object({ id: z.uuid(), email: z.string(), name: z.string() }).nullable(),
    targetType: z.string().nullable(),
    targetId: z.string().nullable(),
    ip: z.string().nullable(),
    userAgent: z.string().nullable(),
    details: z.record(z.string(), z.unknown()),
    createdAt: Timestamp,
  })
  .meta({ id: 'AuditEvent' });
export type AuditEvent = z.infer<typeof AuditEventSchema>;
export const AuditEventPageSchema = z
  .object({ events: z.array(AuditEventSchema), nextCursor: z.number().int().nullable() })
  .meta({ id: 'AuditEventPage', description: 'Newest first; pass nextCursor as `before` for the next page.' });
export type AuditEventPage = z.infer<typeof AuditEventPageSchema>;

export const MailboxMessageSchema = z
  .object({
    id: z.string(),
    receivedAt: Timestamp,
    from: z.string(),
    to: z.array(z.string()),
    subject: z.string(),
    text: z.string(),
    links: z.array(z.string()),
  })
  .meta({ id: 'MailboxMessage' });
export type MailboxMessage = z.infer<typeof MailboxMessageSchema>;
export const MailboxSchema = z.object({ messages: z.array(MailboxMessageSchema) }).meta({ id: 'Mailbox', description: 'Development only: mail caught by the local SMTP catcher.' });
export type Mailbox = z.infer<typeof MailboxSchema>;

/** What each role may do in the console; the server enforces it, the screens only follow it. */
export const can = {
  manageMembers: (role: Role | null | undefined) => role === 'owner' || role === 'admin',
  manageSettings: (role: Role | null | undefined) => role === 'owner' || role === 'admin',
  readAudit: (role: Role | null | undefined) => role === 'owner' || role === 'admin',
  deleteOrganization: (role: Role | null | undefined) => role === 'owner',
  transferOwnership: (role: Role | null | undefined) => role === 'owner',
};
