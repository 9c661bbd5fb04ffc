import { AsyncLocalStorage } from 'node:async_hooks';
import type { RequestHandler } from 'express';
import { LRUCache } from 'lru-cache';
import type { Db } from '../db/connect.ts';
import { AppError } from '../http/app-error.ts';
import { ACCESS_CACHE_MS } from './access-cache.ts';

/**
 * The sign-in library treats a session it cannot read as no session; this context lets a request
 * know that its session could not be read because the database failed, so it answers 503, not 401.
 */
const sessionReads = new AsyncLocalStorage<{ failed: boolean }>();

/** Before the sign-in middleware: opens the per-request context. */
export const trackSessionReads: RequestHandler = (_req, _res, next) => sessionReads.run({ failed: false }, next);

/**
 * After it: when the session could not be read (database down), the library would clear the
 * session cookie as if the session had ended; keep it, so an outage signs nobody out.
 */
export const keepSessionCookieWhenUnreadable: RequestHandler = (_req, res, next) => {
  if (sessionReads.getStore()?.failed) res.clearCookie = () => res;
  next();
};

/** On API routes: a request whose session read failed gets 503 instead of being treated as signed out. */
export const refuseWhenSessionsUnreadable: RequestHandler = (_req, _res, next) => {
  if (sessionReads.getStore()?.failed) {
    return next(new AppError('service_unavailable', 'The database is not reachable right now, so your session could not be read. Try again in a minute.'));
  }
  next();
};

type Callback<T = void> = (error: unknown, value?: T) => void;

interface StoredSession {
  header?: { exp?: number };
  [key: string]: unknown;
}

const DEFAULT_TTL_S = 24 * 3600;
/** A session whose data did not change is written back at most this often (rolling expiry refresh). */
const TOUCH_INTERVAL_MS = 5 * 60_000;

/**
 * An express-session compatible store (get/set/destroy) over the app_sessions table, used by the
 * OpenID Connect relying party so that sessions live in PostgreSQL and can be ended server-side.
 */
export class PostgresSessionStore {
  /** sid → when it was last written and what its data was, to skip writes that only move the expiry. */
  private readonly written = new Map<string, { at: number; data: string }>();
  /** Sessions read or written in the last moment (see ACCESS_CACHE_MS), as JSON with their expiry. */
  private readonly recent = new LRUCache<string, { json: string; expireMs: number }>({ max: 10_000, ttl: ACCESS_CACHE_MS });

  constructor(private readonly db: Db) {}

  get(sid: string, callback: Callback<StoredSession | null>): void {
    const recent = this.recent.get(sid);
    // A fresh copy each time: the sign-in library changes the session object it is given.
    if (recent && recent.expireMs > Date.now()) return callback(null, JSON.parse(recent.json) as StoredSession);
    this.db
      .selectFrom('app_sessions')
      .select(['sess', 'expire'])
      .where('sid', '=', sid)
      .where('expire', '>', new Date())
      .executeTakeFirst()
      .then(
        (row) => {
          if (row) this.recent.set(sid, { json: JSON.stringify(row.sess), expireMs: row.expire.getTime() });
          callback(null, (row?.sess as StoredSession | undefined) ?? null);
        },
        (error: unknown) => {
          const context = sessionReads.getStore();
          if (context) context.failed = true;
          callback(error);
        },
      );
  }

  set(sid: string, session: StoredSession, callback: Callback): void {
    const expSeconds = session.header?.exp ?? Math.floor(Date.now() / 1000) + DEFAULT_TTL_S;
    const expire = new Date(expSeconds * 1000);
    // Every request refreshes a rolling session; when only its expiry moved, write it back now and then.
    const data = JSON.stringify(session.data ?? null);
    // Keeps the entry's first time to live: under steady traffic it still goes back to the database.
    this.recent.set(sid, { json: JSON.stringify(session), expireMs: expire.getTime() }, { noUpdateTTL: true });
    const last = this.written.get(sid);
    if (last && last.data === data && Date.now() - last.at < TOUCH_INTERVAL_MS) return callback(null);
    if (this.written.size > 50_000) this.written.clear();
    this.written.set(sid, { at: Date.now(), data });
    this.db
      .insertInto('app_sessions')
      .values({ sid, sess: JSON.stringify(session), expire })
      .onConflict((oc) => oc.column('sid').doUpdateSet({ sess: JSON.stringify(session), expire }))
      .execute()
      .then(
        () => callback(null),
        (error: unknown) => {
          this.written.delete(sid);
          this.recent.delete(sid);
          callback(error);
        },
      );
  }

  destroy(sid: string, callback: Callback): void {
    // A session that could not be read (database down) was not ended: keep it.
    if (sessionReads.getStore()?.failed) return callback(null);
    this.written.delete(sid);
    this.recent.delete(sid);
    this.db
      .deleteFrom('app_sessions')
      .where('sid', '=', sid)
      .execute()
      .then(() => callback(null), callback);
  }

  /** Removes expired rows; called from time to time. */
  async prune(): Promise<number> {
    const result = await this.db.deleteFrom('app_sessions').where('expire', '<', new Date()).executeTakeFirst();
    return Number(result.numDeletedRows);
  }
}
