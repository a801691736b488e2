// The change log: every write that search or other instances must notice adds a row here,
// in the same transaction as the write (db/client's transaction(), whose commit count tells
// this process's search to read the log). Instances follow it by id (see server/search).
import { type Db, noteWrite } from '../../db/client';
import { changeLog } from '../../db/schema';

export type ChangeEntity = 'case' | 'platform';

export async function recordChange(db: Db, shopId: number, entity: ChangeEntity, entityId: number, op: 'upsert' | 'delete' = 'upsert') {
  await db.insert(changeLog).values({ shopId, entity, entityId, op });
  // outside a transaction the row is committed now; inside one, transaction() counts the commit
  noteWrite();
}
