// Sessions in MariaDB (express-mysql-session), passport on top, synchroniser-token CSRF.
import type { Express, RequestHandler } from 'express';
import session from 'express-session';
import MySQLStoreFactory from 'express-mysql-session';
import passport from 'passport';
import { csrfSync } from 'csrf-sync';
import type { Pool } from 'mysql2/promise';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import { loadSessionUser, toSessionUser } from './service';
import type { SessionUser } from './session-user';

export const SESSION_COOKIE = 'causeway.sid';

export function installSessions(app: Express, ctx: AppContext, pool: Pool, secret: string) {
  const MySQLStore = MySQLStoreFactory(session);
  const store = new MySQLStore(
    {
      createDatabaseTable: false, // our migrations own the table
      clearExpired: true,
      checkExpirationInterval: 15 * 60_000,
      schema: { tableName: 'sessions', columnNames: { session_id: 'session_id', expires: 'expires', data: 'data' } },
    },
    pool,
  );
  throttleTouches(store);
  app.use(
    session({
      name: SESSION_COOKIE,
      secret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true, // the idle timeout restarts with each request
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: ctx.config.session.secureCookie,
        maxAge: ctx.config.session.idleMinutes * 60_000,
      },
    }),
  );
  app.use(absoluteTimeout(ctx.config.session.absoluteHours));

  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: number, done) => {
    cachedSessionUser(ctx, id)
      .then((user) => done(null, user ?? false))
      .catch(done);
  });
  app.use(passport.initialize());
  app.use(passport.session());
  return store;
}

/** Ends a session that has lived longer than the absolute limit, however active it was. */
function absoluteTimeout(hours: number): RequestHandler {
  return (req, _res, next) => {
    const signedInAt = req.session?.signedInAt;
    if (signedInAt && Date.now() - signedInAt > hours * 3600_000) {
      // A fresh, empty session replaces it (destroy would leave later middleware without one).
      return req.session.regenerate((err) => next(err));
    }
    next();
  };
}

const csrf = csrfSync({
  getTokenFromRequest: (req) => req.get('x-csrf-token'),
  getTokenFromState: (req) => req.session?.csrfToken,
  storeTokenInState: (req, token) => {
    req.session.csrfToken = token;
  },
  size: 32,
});

export const csrfToken = (req: Parameters<typeof csrf.generateToken>[0]) => req.session.csrfToken ?? csrf.generateToken(req);

/** Refuses every state-changing API request without the session's token in X-CSRF-Token. */
export const csrfProtection: RequestHandler = (req, res, next) => {
  csrf.csrfSynchronisedProtection(req, res, (err?: unknown) => {
    if (err) return next(new HttpError(403, 'csrf', 'The form expired or came from elsewhere. Reload the page and try again.'));
    next();
  });
};

// Per request, express-session reads the session and "touches" it, and passport loads the user:
// three round trips. Touches are throttled to one a minute per session (the idle timeout is
// counted in minutes), and users are cached for a few seconds. Ending sessions deletes their
// rows, so sign-out, password changes and disabled accounts still take effect at once.
const TOUCH_EVERY_MS = 60_000;
const USER_CACHE_MS = 5_000;

function throttleTouches(store: session.Store) {
  const lastTouch = new Map<string, number>();
  const touch = store.touch?.bind(store);
  if (!touch) return;
  store.touch = (sid, sess, callback) => {
    const now = Date.now();
    if (now - (lastTouch.get(sid) ?? 0) < TOUCH_EVERY_MS) return callback?.();
    if (lastTouch.size > 50_000) lastTouch.clear();
    lastTouch.set(sid, now);
    touch(sid, sess, callback);
  };
}

const userCache = new Map<number, { user: SessionUser | null; at: number }>();

async function cachedSessionUser(ctx: AppContext, id: number): Promise<SessionUser | null> {
  const hit = userCache.get(id);
  if (hit && Date.now() - hit.at < USER_CACHE_MS) return hit.user;
  const row = await loadSessionUser(ctx.db, id);
  const user = row && !row.disabled ? toSessionUser(row) : null;
  if (userCache.size > 10_000) userCache.clear();
  userCache.set(id, { user, at: Date.now() });
  return user;
}

/** Drops a user from this instance's cache after a change to their account. */
export const forgetSessionUser = (id: number) => userCache.delete(id);

/** Drops every cached user of a shop after its settings change (other instances catch up within USER_CACHE_MS). */
export function forgetShopUsers(shopId: number) {
  for (const [id, hit] of userCache) if (hit.user?.shopId === shopId) userCache.delete(id);
}
