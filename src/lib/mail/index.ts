// Outgoing mail through nodemailer: to SMTP_URL when set, otherwise to the
// built-in fake SMTP server on loopback (./fake-smtp.ts).
import nodemailer, { type Transporter } from 'nodemailer';
import { getConfig } from '../config';
import { startFakeSmtp, usesFakeMailbox } from './fake-smtp';

export { usesFakeMailbox } from './fake-smtp';

export interface MailInput {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

let transport: Transporter | null = null;
let transportKey = '';

function getTransport(): Transporter {
  const cfg = getConfig();
  const key = cfg.smtpUrl ?? `fake:${cfg.mailPort}`;
  if (!transport || transportKey !== key) {
    transport = cfg.smtpUrl
      ? nodemailer.createTransport(cfg.smtpUrl)
      : nodemailer.createTransport({ host: '127.0.0.1', port: cfg.mailPort, secure: false, ignoreTLS: true, connectionTimeout: 5000 });
    transportKey = key;
  }
  return transport;
}

export function mailFrom(): string {
  return process.env.MAIL_FROM || 'Ionotheca <no-reply@ionotheca.local>';
}

/** Send one message; resolves once the SMTP server has accepted it. */
export async function sendMail({ to, subject, text, html }: MailInput): Promise<{ messageId: string }> {
  if (usesFakeMailbox()) await startFakeSmtp();
  const info = await getTransport().sendMail({ from: mailFrom(), to, subject, text, html });
  return { messageId: info.messageId };
}
