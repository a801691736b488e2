// One-time tokens for invites and password resets. The raw token goes into the e-mailed link;
// only its SHA-256 is stored, so a database dump does not hand out working links.
import { createHash, randomBytes } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import { transaction, type Db } from '../../db/client';
import { authTokens } from '../../db/schema';

export type TokenPurpose = 'invite' | 'reset';

export const TOKEN_LIFETIME_MINUTES: Record<TokenPurpose, number> = { invite: 72 * 60, reset: 30 };

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

/** Issues a new link and kills the user's earlier unused links of the same purpose (only the newest mail works). */
export async function issueToken(db: Db, userId: number, purpose: TokenPurpose): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + TOKEN_LIFETIME_MINUTES[purpose] * 60_000);
  await transaction(db, async (tx) => {
    await tx
      .update(authTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)));
    await tx.insert(authTokens).values({ userId, purpose, tokenHash: sha256(token), expiresAt });
  });
  return token;
}

/** Kills every unused link of a user, whatever its purpose (after a password change). */
export async function revokeTokensOf(db: Db, userId: number) {
  await db.update(authTokens).set({ usedAt: new Date() }).where(and(eq(authTokens.userId, userId), isNull(authTokens.usedAt)));
}

/** Marks the token used and returns its user, or null when unknown, used or expired. */
export async function consumeToken(db: Db, token: string): Promise<{ userId: number; purpose: TokenPurpose } | null> {
  const tokenHash = sha256(token);
  const now = new Date();
  const [row] = await db
    .select()
    .from(authTokens)
    .where(and(eq(authTokens.tokenHash, tokenHash), isNull(authTokens.usedAt), gt(authTokens.expiresAt, now)));
  if (!row) return null;
  // The usedAt guard makes two racing uses of one link resolve to a single winner.
  const [result] = await db
    .update(authTokens)
    .set({ usedAt: now })
    .where(and(eq(authTokens.id, row.id), isNull(authTokens.usedAt)));
  if (result.affectedRows !== 1) return null;
  return { userId: row.userId, purpose: row.purpose };
}
