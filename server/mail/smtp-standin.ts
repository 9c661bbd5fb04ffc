import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CaughtMail {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

export interface SmtpStandIn {
  url: string;
  messages(): CaughtMail[];
  close(): Promise<void>;
}

const KEEP = 200;

/**
 * A local stand-in for the hosted SMTP service: accepts every message on loopback and keeps the
 * latest ones in memory, so development and tests can read what was sent.
 */
export async function startSmtpStandIn(port: number, host = '127.0.0.1'): Promise<SmtpStandIn> {
  const caught: CaughtMail[] = [];
  let next = 1;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Planktide local mail stand-in',
    size: 5 * 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          caught.push({
            id: next++,
            from: parsed.from?.text ?? '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            receivedAt: new Date().toISOString(),
          });
          if (caught.length > KEEP) caught.shift();
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  return {
    url: `smtp://${host}:${actualPort}`,
    messages: () => [...caught],
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
