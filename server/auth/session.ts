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
    loadSessionUser(ctx.db, id)
      .then((user) => done(null, user && !user.disabled ? toSessionUser(user) : false))
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
      return req.session.destroy(() => next());
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
