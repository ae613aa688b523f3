// E-mail through nodemailer. By default a local outbox stands in for the SMTP service: the
// message is rendered by nodemailer's JSON transport and stored in SQLite (admins read it at
// /admin/outbox). With SMTP_URL set, messages go out over SMTP and are still recorded.
import nodemailer, { type Transporter } from 'nodemailer';
import type { Db } from '../db';
import { outbox } from '../db/schema';

export interface Mailer {
  send(message: { to: string; subject: string; text: string; html?: string }): Promise<void>;
}

export function createMailer(db: Db, options: { smtpUrl?: string; from: string }): Mailer {
  const transport: Transporter = options.smtpUrl
    ? nodemailer.createTransport(options.smtpUrl)
    : nodemailer.createTransport({ jsonTransport: true });
  const transportName = options.smtpUrl ? 'smtp' : 'outbox';
  return {
    async send(message) {
      const info = await transport.sendMail({ from: options.from, ...message });
      db.insert(outbox)
        .values({
          to: message.to,
          subject: message.subject,
          text: message.text,
          html: message.html ?? null,
          transport: transportName,
          messageId: info.messageId ?? null,
        })
        .run();
    },
  };
}
