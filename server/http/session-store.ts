import session, { type SessionData } from "express-session";
import connectPgSimple from "connect-pg-simple";
import type pg from "pg";

/** A session's stored expiry is pushed forward at most this often per process (the cookie itself rolls every request). */
export const TOUCH_EVERY_MS = 60_000;
/** Throttle entries are forgotten after this long, so the map holds only recently active sessions. */
const FORGET_AFTER_MS = 10 * TOUCH_EVERY_MS;

/**
 * connect-pg-simple's store (connect-pg-simple 10, index.js `touch`) writes `UPDATE session SET expire` on every
 * request of a rolling session, and express-session waits for it before the response ends. Here a touch answers at
 * once and the write happens in the background, at most once per TOUCH_EVERY_MS per session in this process: a busy
 * user costs one small write a minute instead of one per request, and a slow pool never holds a reply. The stored
 * expiry can lag the cookie by at most TOUCH_EVERY_MS of a 12-hour lifetime.
 */
/** The session table (migrations; created there, never by the library). */
const TABLE = "session";

export function throttledPgStore(
  pool: pg.Pool,
  opts: {
    prune: boolean;
    now?: () => number;
    /** called when a background expiry write has finished (tests) */ written?: (sid: string) => void;
  },
) {
  const PgStore = connectPgSimple(session);
  const now = opts.now ?? Date.now;
  const lastTouch = new Map<string, number>();
  let lastSweep = now();

  class ThrottledTouchStore extends PgStore {
    /**
     * Every request reads its session. connect-pg-simple 10's `get` (index.js) sends `SELECT sess FROM <table> WHERE
     * sid = $1 AND expire >= to_timestamp($2)` with the time in whole seconds rounded up; here the same read goes as a
     * named prepared statement, so PostgreSQL parses and plans it once per connection. It is still read on every
     * request: a session signed out or revoked elsewhere (its row deleted) is refused on the next request. As the
     * library does, a stored text `sess` is parsed, and one that does not parse is destroyed.
     */
    override get(sid: string, callback: (err: unknown, session?: SessionData | null) => void) {
      pool
        .query<{ sess: SessionData | string }>({
          name: "rw_session_read",
          text: `SELECT sess FROM "${TABLE}" WHERE sid = $1 AND expire >= to_timestamp($2)`,
          values: [sid, Math.ceil(Date.now() / 1000)],
        })
        .then(
          ({ rows: [row] }) => {
            if (!row) return callback(null);
            let sess: SessionData;
            try {
              sess = typeof row.sess === "string" ? (JSON.parse(row.sess) as SessionData) : row.sess;
            } catch {
              return this.destroy(sid, callback);
            }
            callback(null, sess);
          },
          (err: unknown) => callback(err),
        );
    }

    override touch(sid: string, sess: SessionData, callback?: () => void) {
      const t = now();
      if (t - lastSweep > FORGET_AFTER_MS) {
        for (const [k, at] of lastTouch) if (t - at > FORGET_AFTER_MS) lastTouch.delete(k);
        lastSweep = t;
      }
      const last = lastTouch.get(sid);
      if (last === undefined || t - last >= TOUCH_EVERY_MS) {
        lastTouch.set(sid, t);
        // The library logs a failed write through errorLog; the session simply stays as it was stored.
        super.touch(sid, sess, () => opts.written?.(sid));
      }
      callback?.();
    }
  }
  return new ThrottledTouchStore({
    pool,
    tableName: TABLE,
    createTableIfMissing: false,
    // Expired sessions are pruned every 15 minutes; tests build many apps and skip the timer.
    pruneSessionInterval: opts.prune ? 15 * 60 : false,
  });
}
