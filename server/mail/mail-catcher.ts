import { randomUUID } from 'node:crypto';
import { mkdirSync, writeFileSync, renameSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { SHOP_HEADER } from './mailer';

/** A message the catcher kept, as stored on disk. */
export interface StoredMail {
  /** A random id. */
  id: string;
  /** Recipient addresses from the envelope. */
  to: string[];
  /** The From header. */
  from: string;
  /** The Subject header. */
  subject: string;
  /** When the catcher received it (ISO 8601). */
  receivedAt: string;
  /** The plain-text body. */
  text: string;
  /** The shop named by the message's shop header, or null. */
  shopId: string | null;
}

/** A running mail catcher. */
export interface MailCatcher {
  /** The SMTP URL to send to. */
  url: string;
  /** Stops listening. */
  close(): Promise<void>;
}

/**
 * A local SMTP server for development and tests: accepts every message on loopback without
 * authentication and keeps each as a JSON file in `dir`; nothing is delivered anywhere.
 */
export async function startMailCatcher(dir: string, port = 0): Promise<MailCatcher> {
  mkdirSync(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Cellsmith development mail catcher',
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const header = parsed.headers.get(SHOP_HEADER.toLowerCase());
          const mail: StoredMail = {
            id: randomUUID(),
            to: session.envelope.rcptTo.map((rcpt) => rcpt.address),
            from: parsed.from?.text ?? '',
            subject: parsed.subject ?? '',
            receivedAt: new Date().toISOString(),
            text: parsed.text ?? '',
            shopId: typeof header === 'string' ? header : null,
          };
          // Write then rename, so a reader never sees half a message.
          const name = `${Date.now()}-${mail.id}.json`;
          writeFileSync(join(dir, `.${name}.tmp`), JSON.stringify(mail, null, 2));
          renameSync(join(dir, `.${name}.tmp`), join(dir, name));
          callback();
        })
        .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
    },
  });
  await new Promise<void>((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolvePromise());
  });
  const address = server.server.address() as AddressInfo;
  return {
    url: `smtp://127.0.0.1:${address.port}`,
    close: () => new Promise<void>((resolvePromise) => server.close(() => resolvePromise())),
  };
}
