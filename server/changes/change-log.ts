// The change log: every write that search or other instances must notice adds a row here,
// in the same transaction as the write, run through db/client's transaction() (its commit
// count tells this instance's search to read the log). Instances follow it by id (see server/search).
import type { Db } from '../../db/client';
import { changeLog } from '../../db/schema';

export type ChangeEntity = 'case' | 'platform';

export async function recordChange(db: Db, shopId: number, entity: ChangeEntity, entityId: number, op: 'upsert' | 'delete' = 'upsert') {
  await db.insert(changeLog).values({ shopId, entity, entityId, op });
}
