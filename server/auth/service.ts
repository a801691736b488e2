import { and, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { Db } from '../../db/client';
import { sessions, shops, users } from '../../db/schema';
import type { loginSchema, signupSchema } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { conflict, HttpError } from '../http/errors';
import { resetMail } from '../mail/templates';
import { dummyVerify, hashPassword, verifyPassword } from './passwords';
import type { SessionUser } from './session-user';
import { consumeToken, issueToken } from './tokens';

export const GENERIC_LOGIN_FAILURE = 'That e-mail and password do not match an active account.';

// Account back-off: free attempts, then a lock that doubles per failure up to an hour.
// That keeps failures far below ASVS 2.2.1's 100 per hour per account.
const FREE_FAILURES = 5;
const MAX_LOCK_MS = 60 * 60_000;
export const lockDurationMs = (failures: number) =>
  failures < FREE_FAILURES ? 0 : Math.min(MAX_LOCK_MS, 30_000 * 2 ** (failures - FREE_FAILURES));

export async function loadSessionUser(db: Db, userId: number): Promise<(SessionUser & { disabled: boolean; passwordChangedAt: Date | null }) | null> {
  const [row] = await db
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      role: users.role,
      shopId: users.shopId,
      shopName: shops.name,
      disabled: users.disabled,
      passwordChangedAt: users.passwordChangedAt,
    })
    .from(users)
    .innerJoin(shops, eq(shops.id, users.shopId))
    .where(eq(users.id, userId));
  return row ?? null;
}

export const toSessionUser = ({ id, name, email, role, shopId, shopName }: SessionUser): SessionUser => ({
  id,
  name,
  email,
  role,
  shopId,
  shopName,
});

export async function signUp(ctx: AppContext, input: z.infer<typeof signupSchema>): Promise<SessionUser> {
  const passwordHash = await hashPassword(input.password);
  try {
    const userId = await ctx.db.transaction(async (tx) => {
      const [shop] = await tx.insert(shops).values({ name: input.shopName }).$returningId();
      const [user] = await tx
        .insert(users)
        .values({ shopId: shop!.id, name: input.name, email: input.email, role: 'manager', passwordHash, passwordChangedAt: new Date() })
        .$returningId();
      return user!.id;
    });
    return toSessionUser((await loadSessionUser(ctx.db, userId))!);
  } catch (err) {
    if (isDuplicate(err)) throw conflict('An account with that e-mail already exists. Sign in or reset the password.');
    throw err;
  }
}

export function isDuplicate(err: unknown): boolean {
  const cause = (err as { cause?: { code?: string } })?.cause ?? (err as { code?: string });
  return cause?.code === 'ER_DUP_ENTRY';
}

/** Checks a sign-in; throws 401 with one generic message, or 429 while the account is backed off. */
export async function authenticate(db: Db, input: z.infer<typeof loginSchema>): Promise<SessionUser> {
  const [user] = await db.select().from(users).where(eq(users.email, input.email));
  if (!user || !user.passwordHash) {
    await dummyVerify(input.password);
    throw new HttpError(401, 'bad_credentials', GENERIC_LOGIN_FAILURE);
  }
  if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) {
    const minutes = Math.ceil((user.lockedUntil.getTime() - Date.now()) / 60_000);
    throw new HttpError(429, 'too_many_attempts', `Too many failed sign-ins. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset the password.`);
  }
  const ok = await verifyPassword(user.passwordHash, input.password);
  if (!ok || user.disabled) {
    const failures = user.failedLogins + 1;
    const lock = lockDurationMs(failures);
    await db
      .update(users)
      .set({ failedLogins: failures, lockedUntil: lock ? new Date(Date.now() + lock) : null })
      .where(eq(users.id, user.id));
    throw new HttpError(401, 'bad_credentials', GENERIC_LOGIN_FAILURE);
  }
  if (user.failedLogins > 0) await db.update(users).set({ failedLogins: 0, lockedUntil: null }).where(eq(users.id, user.id));
  return toSessionUser((await loadSessionUser(db, user.id))!);
}

/** Ends every session of a user on the server (password change, disabled account). */
export async function endSessionsOf(db: Db, userId: number) {
  await db.delete(sessions).where(sql`JSON_VALUE(${sessions.data}, '$.passport.user') = ${userId}`);
}

export async function requestPasswordReset(ctx: AppContext, email: string) {
  const [user] = await ctx.db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.email, email), eq(users.disabled, false)));
  if (!user) return;
  const token = await issueToken(ctx.db, user.id, 'reset');
  await ctx.mailer.send(resetMail(user.email, user.name, `${ctx.config.publicUrl}/set-password?token=${token}&kind=reset`));
}

export async function setPasswordWithToken(db: Db, token: string, password: string) {
  const used = await consumeToken(db, token);
  if (!used) throw new HttpError(400, 'bad_token', 'That link has expired or was already used. Ask for a new one.');
  const passwordHash = await hashPassword(password);
  await db
    .update(users)
    .set({ passwordHash, passwordChangedAt: new Date(), failedLogins: 0, lockedUntil: null })
    .where(eq(users.id, used.userId));
  await endSessionsOf(db, used.userId);
  return used;
}
