import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';

export interface StoredMail {
  id: string;
  messageId: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  receivedAt: string;
}

/** Messages caught by the local fake SMTP server, keyed by our own id so none overwrites another. */
export class FakeInbox {
  private readonly messages = new Map<string, StoredMail>();
  constructor(private readonly capacity = 500) {}

  add(mail: Omit<StoredMail, 'id'>): StoredMail {
    const stored = { id: randomUUID(), ...mail };
    this.messages.set(stored.id, stored);
    while (this.messages.size > this.capacity) {
      const oldest = this.messages.keys().next().value;
      if (oldest === undefined) break;
      this.messages.delete(oldest);
    }
    return stored;
  }
  list(): StoredMail[] {
    return [...this.messages.values()].reverse();
  }
  get(id: string): StoredMail | undefined {
    return this.messages.get(id);
  }
  /** Newest message to an address (tests use it to follow links). */
  latestTo(address: string): StoredMail | undefined {
    const lower = address.toLowerCase();
    return this.list().find((m) => m.to.some((t) => t.toLowerCase() === lower));
  }
  clear() {
    this.messages.clear();
  }
}

/** A local SMTP server on loopback that stores every message it receives in `inbox`. */
export async function startFakeSmtp(inbox: FakeInbox, port = 0): Promise<{ port: number; close(): Promise<void> }> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = session.envelope.rcptTo.map((r) => r.address);
          inbox.add({
            messageId: parsed.messageId ?? randomUUID(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            receivedAt: new Date().toISOString(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address() as AddressInfo;
  return {
    port: address.port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
