// The demo shop with its people and platforms; case notes join it once the importer runs.
import type { Db } from '../../db/client';
import { loadDemoData } from './demo';

export function seedDemoShop(db: Db, root: string) {
  return loadDemoData(db, root);
}
