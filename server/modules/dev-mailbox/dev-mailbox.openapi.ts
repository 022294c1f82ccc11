import { MailboxSchema } from '#shared/schemas/accounts.ts';
import { registerConsolePath } from '../console/console.openapi.ts';

registerConsolePath({
  method: 'get',
  path: '/dev/mailbox',
  summary: 'Development mailbox',
  description: 'Mail caught by the local SMTP catcher, newest first (at most 100), so e-mailed links can be followed without a mail service.',
  access: 'development',
  response: { status: 200, description: 'The caught messages.', schema: MailboxSchema },
});

registerConsolePath({
  method: 'delete',
  path: '/dev/mailbox',
  summary: 'Empty the development mailbox',
  description: 'Deletes every caught message.',
  access: 'development',
  response: { status: 204, description: 'Emptied.' },
});
