import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import {
  loginSchema,
  resetRequestSchema,
  setPasswordSchema,
  signupSchema,
} from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { HttpError, unauthorised } from '../http/errors';
import { can } from '../http/guard';
import { MariaDbRateLimitStore } from '../http/rate-limit-store';
import { valid, validate } from '../http/validate';
import { csrfToken, SESSION_COOKIE } from './session';
import { authenticate, requestPasswordReset, setPasswordWithToken, signUp } from './service';
import type { SessionUser } from './session-user';

function signIn(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) => {
    // passport regenerates the session (new id, ASVS 7.2.4); keepSessionInfo carries the CSRF token over.
    req.login(user, { session: true, keepSessionInfo: true }, (err) => {
      if (err) return reject(err);
      req.session.signedInAt = Date.now();
      resolve();
    });
  });
}

export function authRoutes(ctx: AppContext) {
  const r = Router();
  const perAddress = rateLimit({
    windowMs: 10 * 60_000,
    limit: ctx.config.limits.authPerAddress,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new MariaDbRateLimitStore(ctx.db, 'auth:'), // shared by every instance
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'too_many_requests', 'Too many attempts from this address. Wait ten minutes and try again.')),
  });

  r.get('/auth/csrf', can('auth.public'), (req, res) => {
    res.json({ token: csrfToken(req) });
  });

  r.post('/auth/signup', can('auth.public'), perAddress, validate('body', signupSchema), (req, res) => {
    // Answer at once and the same way whether or not the address is taken: the mail says which.
    signUp(ctx, valid(req, 'body', signupSchema)).catch((err) => ctx.log.error({ err }, 'sign-up failed'));
    res.status(202).json({ ok: true, message: 'Check the inbox of that address: the link we sent sets your password and opens your shop.' });
  });

  r.post('/auth/login', can('auth.public'), perAddress, validate('body', loginSchema), async (req, res) => {
    const user = await authenticate(ctx.db, valid(req, 'body', loginSchema));
    await signIn(req, user);
    res.json({ user });
  });

  r.post('/auth/logout', can('auth.public'), (req, res, next) => {
    req.logout({ keepSessionInfo: false }, (err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie(SESSION_COOKIE).status(204).end();
      });
    });
  });

  r.get('/auth/me', can('auth.public'), (req, res, next) => {
    if (!req.user) return next(unauthorised('You are not signed in.'));
    res.json({ user: req.user });
  });

  r.post('/auth/reset-request', can('auth.public'), perAddress, validate('body', resetRequestSchema), async (req, res) => {
    const { email } = valid(req, 'body', resetRequestSchema);
    // Answer at once and the same way whether or not the account exists (no account probing).
    requestPasswordReset(ctx, email).catch((err) => ctx.log.error({ err }, 'reset e-mail failed'));
    res.status(202).json({ ok: true, message: 'If that address has an account, a reset link is on its way.' });
  });

  r.post('/auth/reset', can('auth.public'), perAddress, validate('body', setPasswordSchema), async (req, res) => {
    const { token, password } = valid(req, 'body', setPasswordSchema);
    const used = await setPasswordWithToken(ctx.db, token, password);
    res.json({ ok: true, purpose: used.purpose });
  });

  return r;
}
