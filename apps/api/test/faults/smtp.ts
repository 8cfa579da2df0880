import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { AddressInfo } from 'node:net';
import type { Processes } from './processes';

export interface Delivered {
  to: string;
  subject: string;
}

/**
 * An SMTP server whose acceptance the test controls: while `holdWhen` matches a message, it is
 * read but never answered, so the sender is stuck mid-send (and the mail counts as not delivered).
 */
export async function controllableSmtp(procs: Processes) {
  const delivered: Delivered[] = [];
  let holdWhen: (m: Delivered, n: number) => boolean = () => false;
  let onHeld: () => void = () => {};
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const m = { to: session.envelope.rcptTo.map((r) => r.address).join(','), subject: parsed.subject ?? '' };
          if (holdWhen(m, delivered.length)) {
            onHeld();
            return; // never answered: the sender waits until it dies
          }
          delivered.push(m);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  procs.add('smtp', () => new Promise<void>((r) => server.close(() => r())));
  return {
    port: (server.server.address() as AddressInfo).port,
    delivered,
    /** Hold the next message matching `when`; resolves when one arrives. */
    hold(when: (m: Delivered, n: number) => boolean) {
      holdWhen = when;
      return new Promise<void>((r) => (onHeld = r));
    },
    release() {
      holdWhen = () => false;
    },
  };
}
