import { simpleParser } from 'mailparser';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';

export interface ReceivedMail {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

/** In-memory mailbox of the local SMTP stand-in; the development mailbox page reads it. */
export class Mailbox {
  private readonly mails: ReceivedMail[] = [];
  private readonly limit = 500;

  add(mail: ReceivedMail): void {
    this.mails.unshift(mail);
    this.mails.length = Math.min(this.mails.length, this.limit);
  }

  list(): ReceivedMail[] {
    return [...this.mails];
  }

  clear(): void {
    this.mails.length = 0;
  }
}

/** A local SMTP server that accepts every message on loopback and keeps it in a mailbox. */
export async function startSmtpFake(options: { host?: string; port?: number; mailbox?: Mailbox } = {}): Promise<{
  port: number;
  mailbox: Mailbox;
  close(): Promise<void>;
}> {
  const mailbox = options.mailbox ?? new Mailbox();
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : [];
          mailbox.add({
            id: randomUUID(),
            from: parsed.from?.text ?? '',
            to: to.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            receivedAt: new Date().toISOString(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, options.host ?? '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    port,
    mailbox,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
