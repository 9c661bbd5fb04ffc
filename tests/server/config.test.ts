import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, parseConfig } from '../../server/config.ts';

const ROOT = path.resolve(import.meta.dirname, '../..');

describe('configuration', () => {
  it('fills every default when nothing is set', () => {
    const config = parseConfig({}, '/srv/planktide');
    expect(config.PORT).toBe(3000);
    expect(config.HOST).toBe('127.0.0.1');
    expect(config.DATABASE_URL).toBeUndefined();
    expect(config.PLANKTIDE_DATA_DIR).toBe(path.resolve('/srv/planktide', '.data'));
  });

  it('lists every problem at once, naming the variable, the rule and the given value', () => {
    let caught: unknown;
    try {
      parseConfig({ PORT: 'abc', DATABASE_URL: 'mysql://x', LOG_LEVEL: 'loud' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ConfigError);
    const message = (caught as ConfigError).message;
    expect((caught as ConfigError).problems).toHaveLength(3);
    expect(message).toMatch(/PORT: must be a whole number \(got "abc"\)/);
    expect(message).toMatch(/DATABASE_URL: must be a postgres:\/\/ connection URL \(got "mysql:\/\/x"\)/);
    expect(message).toMatch(/LOG_LEVEL: .*\(got "loud"\)/);
  });

  it('rejects a port out of range', () => {
    expect(() => parseConfig({ PORT: '70000' })).toThrow(/PORT: must be between 1 and 65535/);
  });

  it('makes the server exit with status 1 and a readable message on a bad setting', () => {
    const result = spawnSync(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
      cwd: ROOT,
      env: { ...process.env, PORT: 'eighty', DATABASE_URL: '' },
      encoding: 'utf8',
      timeout: 30_000,
    });
    expect(result.status).toBe(1);
    expect(result.stderr).toContain('Planktide cannot start');
    expect(result.stderr).toContain('PORT: must be a whole number (got "eighty")');
  });
});
