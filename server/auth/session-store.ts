import type { Db } from '../db/connect.ts';

type Callback<T = void> = (error: unknown, value?: T) => void;

interface StoredSession {
  header?: { exp?: number };
  [key: string]: unknown;
}

const DEFAULT_TTL_S = 24 * 3600;

/**
 * An express-session compatible store (get/set/destroy) over the app_sessions table, used by the
 * OpenID Connect relying party so that sessions live in PostgreSQL and can be ended server-side.
 */
export class PostgresSessionStore {
  constructor(private readonly db: Db) {}

  get(sid: string, callback: Callback<StoredSession | null>): void {
    this.db
      .selectFrom('app_sessions')
      .select('sess')
      .where('sid', '=', sid)
      .where('expire', '>', new Date())
      .executeTakeFirst()
      .then((row) => callback(null, (row?.sess as StoredSession | undefined) ?? null), callback);
  }

  set(sid: string, session: StoredSession, callback: Callback): void {
    const expSeconds = session.header?.exp ?? Math.floor(Date.now() / 1000) + DEFAULT_TTL_S;
    const expire = new Date(expSeconds * 1000);
    this.db
      .insertInto('app_sessions')
      .values({ sid, sess: JSON.stringify(session), expire })
      .onConflict((oc) => oc.column('sid').doUpdateSet({ sess: JSON.stringify(session), expire }))
      .execute()
      .then(() => callback(null), callback);
  }

  destroy(sid: string, callback: Callback): void {
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
