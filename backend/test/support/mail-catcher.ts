import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CaughtMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  attachments: { filename: string | undefined; contentType: string; content: Buffer }[];
}

/** An SMTP server inside the test process: every message sent to it is parsed and kept. */
export async function startMailCatcher() {
  const inbox: CaughtMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const to = Array.isArray(mail.to) ? mail.to[0] : mail.to;
          inbox.push({
            to: to?.value[0]?.address ?? '',
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            attachments: mail.attachments.map((a) => ({
              filename: a.filename,
              contentType: a.contentType,
              content: a.content,
            })),
          });
          callback();
        })
        .catch(callback);
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    inbox,
    /** The last message to that address, waiting briefly for it to arrive. */
    async lastTo(address: string, timeoutMs = 5000): Promise<CaughtMail> {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = [...inbox].reverse().find((m) => m.to.toLowerCase() === address.toLowerCase());
        if (found) return found;
        if (Date.now() > deadline) throw new Error(`No mail to ${address}`);
        await new Promise((r) => setTimeout(r, 50));
      }
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

export type MailCatcher = Awaited<ReturnType<typeof startMailCatcher>>;
