/**
 * The account e-mails: short, plain, with the one link and what to do if it was not you. Each returns
 * text and an equivalent HTML part. Links carry their token after `#`, so it never reaches a server log
 * or a Referer header: the console page reads it and posts it.
 */
import type { OutgoingMail } from './mailer.ts';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function render(to: string, subject: string, paragraphs: string[], link: { label: string; url: string }, footer: string): OutgoingMail {
  const text = [...paragraphs, `${link.label}:\n${link.url}`, footer, '— Ohmstead'].join('\n\n');
  const html = `<!doctype html><html><body style="font-family:Inter,Arial,sans-serif;color:#2b2a28;background:#faf7f2;padding:24px">
${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
<p><a href="${escapeHtml(link.url)}" style="color:#a85a23;font-weight:600">${escapeHtml(link.label)}</a></p>
<p style="color:#57534d;font-size:13px">${escapeHtml(footer)}</p>
<p style="color:#57534d;font-size:13px">— Ohmstead</p>
</body></html>`;
  return { to, subject, text, html };
}

export function verificationMail(to: string, name: string, url: string, validHours: number): OutgoingMail {
  return render(
    to,
    'Confirm your e-mail address for Ohmstead',
    [`Hello ${name},`, `Please confirm that ${to} is your address. The link works once and for ${validHours} hours.`],
    { label: 'Confirm my address', url },
    'If you did not create an Ohmstead account, ignore this message: nothing happens without the link.',
  );
}

export function passwordResetMail(to: string, url: string, validMinutes: number): OutgoingMail {
  return render(
    to,
    'Reset your Ohmstead password',
    ['Someone (hopefully you) asked to reset the password of the Ohmstead account for this address.', `The link works once and for ${validMinutes} minutes. Setting a new password signs out every browser.`],
    { label: 'Choose a new password', url },
    'If you did not ask for this, ignore this message: your password stays as it is.',
  );
}

export function invitationMail(to: string, organizationName: string, inviterName: string, role: string, url: string, validDays: number): OutgoingMail {
  return render(
    to,
    `${inviterName} invited you to ${organizationName} on Ohmstead`,
    [`${inviterName} invited you to join ${organizationName} on Ohmstead as ${role === 'admin' ? 'an' : 'a'} ${role}.`, `The invitation works once and for ${validDays} days. You can sign up with this address if you have no account yet.`],
    { label: 'See the invitation', url },
    'If you do not know the sender, ignore this message.',
  );
}

export function passwordChangedMail(to: string, url: string): OutgoingMail {
  return render(
    to,
    'Your Ohmstead password was changed',
    ['The password of your Ohmstead account was just changed, and other browsers were signed out.', 'If this was you, there is nothing to do.'],
    { label: 'If it was not you, reset your password now', url },
    'Ohmstead never asks for your password by e-mail.',
  );
}
