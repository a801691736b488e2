import { and, asc, eq, isNotNull, sql } from 'drizzle-orm';
import { transaction, type Db } from '../../db/client';
import type { z } from 'zod';
import { users } from '../../db/schema';
import type { inviteSchema, ShopUser, userPatchSchema } from '../../shared/schemas/auth';
import { endSessionsOf, isDuplicate } from '../auth/service';
import { forgetSessionUser } from '../auth/session';
import type { SessionUser } from '../auth/session-user';
import { issueToken, revokeTokensOf } from '../auth/tokens';
import type { AppContext } from '../context';
import { conflict, HttpError, notFound } from '../http/errors';
import { inviteMail } from '../mail/templates';

const shopUserColumns = {
  id: users.id,
  name: users.name,
  email: users.email,
  role: users.role,
  disabled: users.disabled,
  invited: sql<number>`(${users.passwordHash} IS NULL)`,
  createdAt: users.createdAt,
};

type ShopUserRow = { [K in keyof typeof shopUserColumns]: unknown } & { createdAt: Date; invited: number | boolean };

const toShopUser = (row: ShopUserRow): ShopUser => ({
  ...(row as unknown as ShopUser),
  invited: Boolean(row.invited),
  createdAt: row.createdAt.toISOString(),
});

export async function listShopUsers(ctx: AppContext, shopId: number): Promise<ShopUser[]> {
  const rows = await ctx.db.select(shopUserColumns).from(users).where(eq(users.shopId, shopId)).orderBy(asc(users.name));
  return rows.map((r) => toShopUser(r as ShopUserRow));
}

async function getShopUser(ctx: AppContext, shopId: number, userId: number): Promise<ShopUser> {
  const [row] = await ctx.db.select(shopUserColumns).from(users).where(and(eq(users.id, userId), eq(users.shopId, shopId)));
  if (!row) throw notFound('That user');
  return toShopUser(row as ShopUserRow);
}

export async function inviteUser(ctx: AppContext, manager: SessionUser, input: z.infer<typeof inviteSchema>): Promise<ShopUser> {
  let userId: number;
  try {
    [{ id: userId }] = (await ctx.db
      .insert(users)
      .values({ shopId: manager.shopId, name: input.name, email: input.email, role: input.role })
      .$returningId()) as [{ id: number }];
  } catch (err) {
    if (isDuplicate(err)) throw conflict('Someone already uses that e-mail address on Causeway.');
    throw err;
  }
  const token = await issueToken(ctx.db, userId, 'invite');
  const url = `${ctx.config.publicUrl}/set-password?token=${token}&kind=invite`;
  await ctx.mailer.send(inviteMail(input.email, input.name, manager.name, manager.shopName, url));
  return getShopUser(ctx, manager.shopId, userId);
}

/**
 * Locks the shop's active managers: not disabled and holding a password (signed up or accepted
 * their invite). The locking read makes two managers who demote themselves at once queue up,
 * so the second sees the first one's change.
 */
async function lockActiveManagerIds(tx: Db, shopId: number): Promise<number[]> {
  const rows = await tx
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.shopId, shopId), eq(users.role, 'manager'), eq(users.disabled, false), isNotNull(users.passwordHash)))
    .for('update');
  return rows.map((r) => r.id);
}

const givesUpManagerSeat = (patch: z.infer<typeof userPatchSchema>) =>
  (patch.role !== undefined && patch.role !== 'manager') || patch.disabled === true;

export async function updateUser(ctx: AppContext, manager: SessionUser, userId: number, patch: z.infer<typeof userPatchSchema>): Promise<ShopUser> {
  await getShopUser(ctx, manager.shopId, userId); // 404 for another shop's user
  await transaction(ctx.db, async (tx) => {
    const managers = await lockActiveManagerIds(tx, manager.shopId);
    if (givesUpManagerSeat(patch) && managers.includes(userId) && managers.length === 1) {
      throw new HttpError(409, 'last_manager', 'A shop needs at least one active manager. Make someone else manager first.');
    }
    await tx.update(users).set(patch).where(and(eq(users.id, userId), eq(users.shopId, manager.shopId)));
  });
  forgetSessionUser(userId);
  // Roles are re-read on every request; a disabled account must also lose its sessions and links.
  if (patch.disabled) {
    await endSessionsOf(ctx.db, userId);
    await revokeTokensOf(ctx.db, userId);
  }
  return getShopUser(ctx, manager.shopId, userId);
}
