// Loads the demo shop once per database. A marker row in app_meta makes later starts skip it;
// everything is written in one transaction so a failed load leaves nothing half done.
import path from 'node:path';
import { eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { appMeta, platforms, shops, users } from '../../db/schema';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { DEMO_PASSWORD, readDemoPlatforms, readDemoShop, type DemoShop } from './demo-files';

const MARKER = 'demo_loaded';

export interface DemoLoadResult {
  loaded: boolean;
  shopId: number;
  users: DemoShop['users'];
}

export async function loadDemoData(db: Db, root: string, extra?: (tx: Db, shopId: number, userIds: Map<string, number>, platformIds: Map<string, number>) => Promise<void>): Promise<DemoLoadResult> {
  const contentDir = path.join(root, 'content');
  const demo = readDemoShop(contentDir);
  const [marker] = await db.select().from(appMeta).where(eq(appMeta.key, MARKER));
  if (marker) return { loaded: false, shopId: Number(marker.value), users: demo.users };
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const demoPlatforms = readDemoPlatforms(contentDir);
  const shopId = await db.transaction(async (tx) => {
    const [shop] = await tx
      .insert(shops)
      .values({ name: demo.shop.name, comebackDays: demo.shop.comebackDays, comebackKm: demo.shop.comebackKm, country: demo.shop.country, timeZone: demo.shop.timeZone })
      .$returningId();
    const userIds = new Map<string, number>();
    for (const u of demo.users) {
      const [row] = await tx
        .insert(users)
        .values({ shopId: shop!.id, name: u.name, email: u.email.toLowerCase(), handle: u.key, role: u.role, passwordHash, passwordChangedAt: new Date() })
        .$returningId();
      userIds.set(u.key, row!.id);
    }
    const platformIds = new Map<string, number>();
    for (const p of demoPlatforms) {
      const [row] = await tx.insert(platforms).values({ ...p, shopId: shop!.id }).$returningId();
      platformIds.set(p.key, row!.id);
    }
    if (extra) await extra(tx as unknown as Db, shop!.id, userIds, platformIds);
    await tx.insert(appMeta).values({ key: MARKER, value: String(shop!.id) });
    return shop!.id;
  });
  return { loaded: true, shopId, users: demo.users };
}

/** Demo people (content/shop.yaml) whose account still signs in with the published demo password. */
export async function accountsOnDemoPassword(db: Db, root: string): Promise<string[]> {
  const emails = readDemoShop(path.join(root, 'content')).users.map((u) => u.email.toLowerCase());
  const rows = await db.select({ email: users.email, passwordHash: users.passwordHash }).from(users).where(inArray(users.email, emails));
  const stillDemo = await Promise.all(rows.map(async (r) => (r.passwordHash && (await verifyPassword(r.passwordHash, DEMO_PASSWORD)) ? r.email : null)));
  return stillDemo.filter((e): e is string => e !== null);
}
