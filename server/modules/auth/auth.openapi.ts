import {
  AcceptedSchema,
  EmailInputSchema,
  ResetPasswordInputSchema,
  SessionInfoSchema,
  SignInInputSchema,
  SignUpInputSchema,
  SignUpResultSchema,
  SwitchOrganizationInputSchema,
  TokenInputSchema,
  VerifiedEmailSchema,
} from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

const tokenProblems = { 422: 'Invalid input, a refused password, or a link that is unknown, already used or expired (`errors[0].code`: token_invalid, token_used, token_expired).' };

registerConsolePath({
  method: 'post',
  path: '/auth/sign-up',
  summary: 'Sign up',
  description: 'Creates an unconfirmed account (and, with `organizationName`, an organization it owns) and e-mails a confirmation link valid for 24 hours. Passwords: at least 15 characters, no composition rules; common and breached passwords are refused.',
  access: 'public',
  body: SignUpInputSchema,
  response: { status: 201, description: 'Created; confirm the address before signing in.', schema: SignUpResultSchema },
  problems: { 409: 'An account with this e-mail address already exists.', 429: 'Too many e-mail-sending requests from this address.' },
});

registerConsolePath({
  method: 'post',
  path: '/auth/sign-in',
  summary: 'Sign in',
  description: 'Checks the password and starts a new session (a new cookie every time). Failed attempts are throttled per account and per network address.',
  access: 'public',
  body: SignInInputSchema,
  response: { status: 200, description: 'Signed in; the session cookie is set.', schema: SessionInfoSchema },
  problems: {
    401: 'The e-mail address or the password is not right.',
    403: 'The address is not confirmed yet (`reason: email_unverified`), or a cross-site request.',
    429: 'Too many failed sign-ins for this account or from this address; see Retry-After.',
  },
});

registerConsolePath({
  method: 'post',
  path: '/auth/sign-out',
  summary: 'Sign out',
  description: 'Ends this session and clears the cookie. Succeeds also without a session.',
  access: 'public',
  response: { status: 204, description: 'Signed out.' },
});

registerConsolePath({
  method: 'post',
  path: '/auth/verify-email',
  summary: 'Confirm an e-mail address',
  description: 'Uses the token from the confirmation link (single use).',
  access: 'public',
  body: TokenInputSchema,
  response: { status: 200, description: 'Confirmed.', schema: VerifiedEmailSchema },
  problems: tokenProblems,
});

registerConsolePath({
  method: 'post',
  path: '/auth/resend-verification',
  summary: 'Send a new confirmation link',
  description: 'Answers the same whether or not the address has an unconfirmed account.',
  access: 'public',
  body: EmailInputSchema,
  response: { status: 202, description: 'Taken.', schema: AcceptedSchema },
  problems: { 429: 'Too many e-mail-sending requests from this address.' },
});

registerConsolePath({
  method: 'post',
  path: '/auth/forgot-password',
  summary: 'Ask for a password reset link',
  description: 'E-mails a reset link valid for one hour when the address has an account; answers the same either way.',
  access: 'public',
  body: EmailInputSchema,
  response: { status: 202, description: 'Taken.', schema: AcceptedSchema },
  problems: { 429: 'Too many e-mail-sending requests from this address.' },
});

registerConsolePath({
  method: 'post',
  path: '/auth/reset-password',
  summary: 'Set a new password from a reset link',
  description: 'Uses the link (single use), sets the password and ends every session of the account.',
  access: 'public',
  body: ResetPasswordInputSchema,
  response: { status: 204, description: 'Password set; sign in with it.' },
  problems: tokenProblems,
});

registerConsolePath({
  method: 'get',
  path: '/session',
  summary: 'The signed-in user',
  description: 'The user, the active organization with the role there, and the other organizations to switch to.',
  access: 'session',
  response: { status: 200, description: 'Signed in.', schema: SessionInfoSchema },
});

registerConsolePath({
  method: 'put',
  path: '/session/organization',
  summary: 'Switch organization',
  description: 'Makes another of your organizations the active one for this session.',
  access: 'session',
  body: SwitchOrganizationInputSchema,
  response: { status: 200, description: 'Switched.', schema: SessionInfoSchema },
  problems: { 404: 'Not one of your organizations.' },
});
