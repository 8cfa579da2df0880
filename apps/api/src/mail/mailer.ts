import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** extra headers, e.g. List-Unsubscribe */
  headers?: Record<string, string>;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/** SMTP through nodemailer: a real provider by URL, or the local fake on a loopback port. */
export function createSmtpMailer(target: { url: string } | { port: number }, from: string): Mailer {
  const transport =
    'url' in target
      ? nodemailer.createTransport(target.url)
      : nodemailer.createTransport({ host: '127.0.0.1', port: target.port, secure: false, ignoreTLS: true });
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
  };
}
