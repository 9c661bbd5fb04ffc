import path from 'node:path';
import { z } from 'zod';

const port = z.coerce
  .number({ error: 'must be a whole number' })
  .int('must be a whole number')
  .min(1, 'must be between 1 and 65535')
  .max(65535, 'must be between 1 and 65535');

const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(3000),
  DATABASE_URL: z
    .url({ protocol: /^postgres(ql)?$/, error: 'must be a postgres:// connection URL' })
    .optional(),
  PLANKTIDE_DATA_DIR: z.string().min(1).default('.data'),
  PLANKTIDE_PG_PORT: port.default(54329),
  PLANKTIDE_CLIENT: z.enum(['built', 'none']).default('built'),
  APP_BASE_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  OIDC_ISSUER_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  OIDC_CLIENT_ID: z.string().min(1).default('planktide-web'),
  OIDC_CLIENT_SECRET: z.string().min(16, 'must be at least 16 characters').optional(),
  OIDC_STANDIN_PORT: port.default(3001),
  SESSION_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  SMTP_URL: z.url({ protocol: /^smtps?$/, error: 'must be an smtp:// or smtps:// URL' }).optional(),
  SMTP_STANDIN_PORT: port.default(2525),
  TIDE_FEED_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  TIDE_FEED_API_KEY: z.string().min(1).default('planktide-local-feed-key'),
  TIDE_FEED_STANDIN_PORT: port.default(3003),
  TIDE_FEED_TIMEOUT_MS: z.coerce.number().int().min(100).max(120_000).default(8000),
  FORECAST_LAYERS: z.coerce.number().int().min(10).max(400).default(50),
  FORECAST_TIME_STEP_S: z.coerce.number().min(1).max(120).default(30),
  PLANKTIDE_WORKERS: z.coerce.number().int().min(0, 'must be 0 or more').max(16).default(1),
  /** CPU priority (nice value) of the worker processes: model runs yield to the web server's answers. */
  PLANKTIDE_WORKER_NICE: z.coerce.number().int().min(0, 'must be 0 (same priority as the web server) or more').max(19, 'must be 19 or less').default(10),
  PLANKTIDE_SCHEDULER: z.enum(['on', 'off']).default('on'),
  /** How long a mail send may wait for the mail service (connect, greeting; twice that for a silent socket). */
  SMTP_TIMEOUT_MS: z.coerce.number().int().min(100).max(120_000).default(10_000),
  QUEUE_JOB_TIMEOUT_S: z.coerce.number().int().min(5).max(86400).default(900),
  QUEUE_RETRY_DELAY_S: z.coerce.number().int().min(1).max(3600).default(30),
  QUEUE_MAINTENANCE_S: z.coerce.number().int().min(1).max(3600).default(60),
  PAYMENTS_URL: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  STRIPE_SECRET_KEY: z.string().min(8).optional(),
  STRIPE_WEBHOOK_SECRET: z.string().min(8).optional(),
  PAYMENTS_STANDIN_PORT: port.default(3002),
  BILLING_GRACE_DAYS: z.coerce.number().int().min(0).max(60).default(7),
  MAIL_FROM: z.string().min(3).default('Planktide <no-reply@planktide.invalid>'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

type ParsedConfig = z.infer<typeof configSchema>;

export type Config = Omit<ParsedConfig, 'APP_BASE_URL' | 'OIDC_CLIENT_SECRET' | 'SESSION_SECRET'> & {
  projectRoot: string;
  APP_BASE_URL: string;
  OIDC_CLIENT_SECRET: string;
  SESSION_SECRET: string;
};

// Development-only defaults: a production start must set its own secrets.
const DEV_CLIENT_SECRET = 'planktide-local-client-secret';
const DEV_SESSION_SECRET = 'planktide-local-session-secret-not-for-production';

function productionProblems(parsed: ParsedConfig): string[] {
  if (parsed.NODE_ENV !== 'production') return [];
  const problems: string[] = [];
  if (!parsed.SESSION_SECRET) problems.push('SESSION_SECRET: must be set in production (at least 32 random characters)');
  if (parsed.OIDC_ISSUER_URL && !parsed.OIDC_CLIENT_SECRET) problems.push('OIDC_CLIENT_SECRET: must be set when OIDC_ISSUER_URL is set in production');
  if ((parsed.PAYMENTS_URL || parsed.STRIPE_SECRET_KEY) && !parsed.STRIPE_WEBHOOK_SECRET) problems.push('STRIPE_WEBHOOK_SECRET: must be set when a payments service is configured in production');
  if (parsed.TIDE_FEED_URL && parsed.TIDE_FEED_API_KEY === 'planktide-local-feed-key') problems.push('TIDE_FEED_API_KEY: must be set when TIDE_FEED_URL is set in production');
  return problems;
}

export class ConfigError extends Error {
  constructor(readonly problems: string[]) {
    super(`Planktide cannot start: the configuration has ${problems.length} problem(s):\n${problems.map((p) => `  - ${p}`).join('\n')}`);
    this.name = 'ConfigError';
  }
}

/** Parses the environment into a typed config, listing every problem at once. */
export function parseConfig(env: Record<string, string | undefined>, projectRoot = process.cwd()): Config {
  const cleaned = Object.fromEntries(Object.entries(env).filter(([, value]) => value !== undefined && value !== ''));
  const result = configSchema.safeParse(cleaned);
  if (!result.success) {
    const problems = result.error.issues.map((issue) => {
      const key = issue.path.join('.');
      const given = cleaned[key];
      const shown = given === undefined ? '' : ` (got "${given}")`;
      return `${key}: ${issue.message}${shown}`;
    });
    throw new ConfigError(problems);
  }
  const parsed = result.data;
  const problems = productionProblems(parsed);
  if (problems.length) throw new ConfigError(problems);
  return {
    ...parsed,
    projectRoot,
    PLANKTIDE_DATA_DIR: path.resolve(projectRoot, parsed.PLANKTIDE_DATA_DIR),
    APP_BASE_URL: (parsed.APP_BASE_URL ?? `http://${parsed.HOST}:${parsed.PORT}`).replace(/\/$/, ''),
    OIDC_CLIENT_SECRET: parsed.OIDC_CLIENT_SECRET ?? DEV_CLIENT_SECRET,
    SESSION_SECRET: parsed.SESSION_SECRET ?? DEV_SESSION_SECRET,
  };
}
