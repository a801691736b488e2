import { and, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { vehicles } from '../../db/schema';
import type { CaseCreate } from '../../shared/schemas/cases';

/** The shop's vehicle with this VIN, created on first sight; plate and fleet number follow the latest visit. */
export async function vehicleIdFor(db: Db, shopId: number, vehicle: CaseCreate['vehicle'], platformId: number | null): Promise<number | null> {
  if (!vehicle?.vin) return null;
  const [found] = await db.select().from(vehicles).where(and(eq(vehicles.shopId, shopId), eq(vehicles.vin, vehicle.vin)));
  if (found) {
    const changes = {
      ...(vehicle.plate && vehicle.plate !== found.plate ? { plate: vehicle.plate } : {}),
      ...(vehicle.fleetNumber && vehicle.fleetNumber !== found.fleetNumber ? { fleetNumber: vehicle.fleetNumber } : {}),
      ...(platformId && !found.platformId ? { platformId } : {}),
    };
    if (Object.keys(changes).length) await db.update(vehicles).set(changes).where(eq(vehicles.id, found.id));
    return found.id;
  }
  const [row] = await db
    .insert(vehicles)
    .values({ shopId, vin: vehicle.vin, plate: vehicle.plate ?? null, fleetNumber: vehicle.fleetNumber ?? null, platformId })
    .$returningId();
  return row!.id;
}
