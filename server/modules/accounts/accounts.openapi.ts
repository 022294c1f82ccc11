import { AccountSessionListSchema, ChangePasswordInputSchema, UpdateAccountInputSchema, UserSchema } from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registerConsolePath({
  method: 'patch',
  path: '/account',
  summary: 'Change your name',
  description: 'Updates the signed-in user’s display name.',
  access: 'session',
  body: UpdateAccountInputSchema,
  response: { status: 200, description: 'Updated.', schema: UserSchema },
});

registerConsolePath({
  method: 'post',
  path: '/account/password',
  summary: 'Change your password',
  description: 'Checks the current password (wrong answers count towards sign-in throttling), sets the new one, ends every other session and gives this browser a new session cookie.',
  access: 'session',
  body: ChangePasswordInputSchema,
  response: { status: 204, description: 'Changed.' },
  problems: { 422: 'The current password is not right, or the new one is refused.', 429: 'Too many failed attempts for this account.' },
});

registerConsolePath({
  method: 'get',
  path: '/account/sessions',
  summary: 'Your signed-in browsers',
  description: 'Live sessions of the signed-in user, most recently used first.',
  access: 'session',
  response: { status: 200, description: 'The sessions.', schema: AccountSessionListSchema },
});

registerConsolePath({
  method: 'post',
  path: '/account/sign-out-everywhere',
  summary: 'Sign out everywhere',
  description: 'Ends every session of the signed-in user, this one included.',
  access: 'session',
  response: { status: 204, description: 'Signed out everywhere.' },
});
