import { createApp, type AppDeps } from '../../server/app.ts';
import type { Db } from '../../server/db/connect.ts';
import { createMailer } from '../../server/mail/mailer.ts';
import { listen, type RunningServer } from './http.ts';
import { quietLogger } from './quiet-logger.ts';

export const TEST_CLIENT_ID = 'planktide-test';
export const TEST_CLIENT_SECRET = 'test-client-secret-0123456789';
export const TEST_SESSION_SECRET = 'test-session-secret-0123456789-abcdefghij';

/**
 * Listens with the full app. The issuer and SMTP URLs may point at nothing when a test needs
 * neither sign-in nor mail (the app only reaches them on use).
 */
export async function startTestApp(
  db: Db,
  options: { issuerUrl?: string; smtpUrl?: string; port?: number; extra?: Partial<AppDeps> } = {},
): Promise<RunningServer & { mailerClose(): void }> {
  const mailer = createMailer(options.smtpUrl ?? 'smtp://127.0.0.1:9', 'Planktide tests <tests@planktide.invalid>');
  const port = options.port;
  if (port === undefined) throw new Error('startTestApp needs the port, so that the app knows its own base URL');
  const app = createApp({
    db,
    logger: quietLogger(),
    version: 'test',
    appBaseUrl: `http://127.0.0.1:${port}`,
    oidc: {
      issuerUrl: options.issuerUrl ?? 'http://127.0.0.1:9',
      clientId: TEST_CLIENT_ID,
      clientSecret: TEST_CLIENT_SECRET,
      sessionSecret: TEST_SESSION_SECRET,
    },
    mailer,
    ...options.extra,
  });
  const server = await listen(app, port);
  return { ...server, mailerClose: () => mailer.close() };
}
