// The built-in fake SMTP server for demos and tests: when SMTP_URL is unset,
// outgoing mail goes to 127.0.0.1:MAIL_PORT, where this server parses each
// message (mailparser) and keeps it in the mail_message table. An admin reads
// them on /admin/mail. Nothing leaves the machine.
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import { getConfig } from '../config';
import { getModels } from '../db';
import { registerStartupStep } from '../runtime';

let starting: Promise<void> | null = null;
let server: SMTPServer | null = null;

/** Whether outgoing mail goes to the built-in fake server (SMTP_URL unset). */
export function usesFakeMailbox(): boolean {
  return !getConfig().smtpUrl;
}

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  const list = Array.isArray(a) ? a : a ? [a] : [];
  return list.flatMap((x) => x.value.map((v) => v.address ?? '')).filter(Boolean).join(', ');
}

/** Start the fake server once per process; resolves when it listens (or another process already holds the port). */
export function startFakeSmtp(): Promise<void> {
  if (starting) return starting;
  const { mailPort } = getConfig();
  starting = new Promise<void>((resolve, reject) => {
    const s = new SMTPServer({
      secure: false,
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      banner: 'Ionotheca local mailbox',
      size: 5 * 1024 * 1024,
      logger: false,
      onData(stream, session, callback) {
        simpleParser(stream)
          .then(async (mail) => {
            const to = addresses(mail.to) || session.envelope.rcptTo.map((r) => r.address).join(', ');
            await getModels().MailMessage.create({
              to,
              from: addresses(mail.from) || (session.envelope.mailFrom ? session.envelope.mailFrom.address : null),
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              html: typeof mail.html === 'string' ? mail.html : null,
              receivedAt: new Date(),
            } as any);
            callback();
          })
          .catch((e) => callback(e as Error));
      },
    });
    s.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EADDRINUSE') {
        console.warn(`[mail] port ${mailPort} is in use; assuming another Ionotheca process keeps the local mailbox`);
        resolve();
      } else console.error('[mail] fake SMTP server error:', e.message);
    });
    s.listen(mailPort, '127.0.0.1', () => {
      server = s;
      resolve();
    });
  }).catch((e) => {
    starting = null;
    throw e;
  });
  return starting;
}

export async function stopFakeSmtp(): Promise<void> {
  const s = server;
  server = null;
  starting = null;
  if (s) await new Promise<void>((r) => s.close(() => r()));
}

registerStartupStep('fake-smtp', async () => {
  if (usesFakeMailbox()) await startFakeSmtp();
});
