import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema.ts';
import type { RunningServer } from '../helpers/http.ts';
import { freePort } from '../helpers/free-port.ts';
import { startTestApp } from '../helpers/test-app.ts';
import { createTestDatabase, type TestDatabase } from '../helpers/test-database.ts';

describe('API error shape', () => {
  let database: TestDatabase;
  let server: RunningServer;
  beforeAll(async () => {
    database = await createTestDatabase();
    server = await startTestApp(database.db, { port: await freePort() });
  });
  afterAll(async () => {
    await server.close();
    await database.drop();
  });

  it('answers an unknown API route with 404 and the one error shape', async () => {
    const response = await fetch(`${server.baseUrl}/api/no-such-thing`);
    expect(response.status).toBe(404);
    const body = apiErrorSchema.parse(await response.json());
    expect(body.error.code).toBe('not_found');
    expect(body.error.message).toContain('/no-such-thing');
  });

  it('answers a malformed JSON body with 400 naming the problem', async () => {
    const response = await fetch(`${server.baseUrl}/api/health`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: '{"broken": ',
    });
    expect(response.status).toBe(400);
    const body = apiErrorSchema.parse(await response.json());
    expect(body.error.code).toBe('bad_request');
    expect(body.error.message).toMatch(/not valid JSON/);
  });

  it('echoes a caller-supplied request id and puts it in error bodies', async () => {
    const response = await fetch(`${server.baseUrl}/api/missing`, { headers: { 'X-Request-Id': 'trace-abc.123' } });
    expect(response.headers.get('x-request-id')).toBe('trace-abc.123');
    expect(apiErrorSchema.parse(await response.json()).error.requestId).toBe('trace-abc.123');
  });

  it('replaces an unsafe request id with a generated one', async () => {
    const response = await fetch(`${server.baseUrl}/api/health`, { headers: { 'X-Request-Id': 'bad id\twith spaces' } });
    expect(response.headers.get('x-request-id')).toMatch(/^[0-9a-f-]{36}$/);
  });
});
