/**
 * Outgoing e-mail through nodemailer over SMTP, configured from the environment (SMTP_HOST, SMTP_PORT,
 * SMTP_SECURE, SMTP_USER, SMTP_PASSWORD, MAIL_FROM). In development and tests that server is the local
 * catcher (server/fakes/smtp-catcher.ts); nothing here knows or cares.
 */
import nodemailer from 'nodemailer';
import type { Env } from '../../env.ts';
import type { Logger } from '../../logger.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  /**
   * Sends one message and resolves when the SMTP server has accepted it. Returns false (and logs) when it
   * could not be sent, so the action that wanted it is not undone; the user can ask for it again.
   */
  send(mail: OutgoingMail): Promise<boolean>;
  close(): void;
}

export function createMailer(env: Env, logger: Logger): Mailer {
  const transport = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
  return {
    async send(mail) {
      try {
        await transport.sendMail({ from: env.MAIL_FROM, ...mail });
        return true;
      } catch (err) {
        // The address is personal data: log the subject and the failure, not the recipient.
        logger.error({ err, subject: mail.subject }, 'e-mail could not be sent');
        return false;
      }
    },
    close() {
      transport.close();
    },
  };
}
