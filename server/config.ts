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
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export type Config = z.infer<typeof configSchema> & { projectRoot: string };

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
  return { ...result.data, projectRoot, PLANKTIDE_DATA_DIR: path.resolve(projectRoot, result.data.PLANKTIDE_DATA_DIR) };
}
