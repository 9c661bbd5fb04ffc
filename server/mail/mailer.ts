import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** Sends mail through any SMTP service named by an smtp:// or smtps:// URL (user and password in the URL). */
export function createMailer(smtpUrl: string, from: string, options: { timeoutMs?: number } = {}): Mailer {
  // A slow mail service fails a send after this long instead of holding the request or job.
  const timeoutMs = options.timeoutMs ?? 10_000;
  const url = new URL(smtpUrl);
  const transport: Transporter = nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port || (url.protocol === 'smtps:' ? 465 : 587)),
    secure: url.protocol === 'smtps:',
    // Plain SMTP on loopback (the local stand-in) has no TLS to upgrade to.
    ignoreTLS: url.protocol === 'smtp:' && (url.hostname === '127.0.0.1' || url.hostname === 'localhost'),
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    connectionTimeout: timeoutMs,
    greetingTimeout: timeoutMs,
    socketTimeout: 2 * timeoutMs,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
    close: () => transport.close(),
  };
}
