// Import a folder of case files into a shop, and export one case in the same format.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { cases, platforms, users, vehicles } from '../../db/schema';
import type { Actor } from '../../shared/policy';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { formatCaseFile, parseCaseFile, type CaseFile } from './case-file';
import { createCase, loadVisibleCase } from './service';

async function shopDirectory(ctx: AppContext, shopId: number) {
  const [people, plats] = await Promise.all([
    ctx.db.select({ id: users.id, handle: users.handle, email: users.email, role: users.role }).from(users).where(eq(users.shopId, shopId)),
    ctx.db.select({ id: platforms.id, key: platforms.key }).from(platforms).where(eq(platforms.shopId, shopId)),
  ]);
  const person = new Map<string, (typeof people)[number]>();
  for (const p of people) {
    person.set(p.email.toLowerCase(), p);
    if (p.handle) person.set(p.handle, p);
  }
  const platform = new Map(plats.filter((p) => p.key).map((p) => [p.key!, p.id]));
  return { person, platform };
}

export interface ImportReport {
  imported: number;
  skipped: number;
  errors: string[];
}

/** Imports every *.md (except README.md) in `dir`; a case whose slug the shop already has is skipped. */
export async function importCaseFolder(ctx: AppContext, shopId: number, dir: string): Promise<ImportReport> {
  const files = readdirSync(dir).filter((f) => f.endsWith('.md') && f.toLowerCase() !== 'readme.md').sort();
  const directory = await shopDirectory(ctx, shopId);
  const existing = new Set((await ctx.db.select({ slug: cases.slug }).from(cases).where(eq(cases.shopId, shopId))).map((r) => r.slug));
  const report: ImportReport = { imported: 0, skipped: 0, errors: [] };
  for (const name of files) {
    try {
      const file = parseCaseFile(readFileSync(path.join(dir, name), 'utf8'), name);
      if (existing.has(file.slug)) {
        report.skipped++;
        continue;
      }
      await importCase(ctx, shopId, file, directory);
      existing.add(file.slug);
      report.imported++;
    } catch (err) {
      report.errors.push(err instanceof Error ? err.message : String(err));
    }
  }
  return report;
}

async function importCase(ctx: AppContext, shopId: number, file: CaseFile, dir: Awaited<ReturnType<typeof shopDirectory>>) {
  const author = dir.person.get(file.author.toLowerCase()) ?? dir.person.get(file.author);
  if (!author) throw new Error(`${file.slug}: author "${file.author}" is not a user of this shop`);
  const platformId = file.platform ? dir.platform.get(file.platform) : undefined;
  if (file.platform && !platformId) throw new Error(`${file.slug}: platform "${file.platform}" is not one of this shop's`);
  const confirmer = file.confirmed ? (dir.person.get(file.confirmed.by) ?? dir.person.get(file.confirmed.by.toLowerCase())) : undefined;
  if (file.confirmed && !confirmer) throw new Error(`${file.slug}: confirmed.by "${file.confirmed.by}" is not a user of this shop`);
  const actor: Actor = { id: author.id, role: 'manager', shopId };
  await createCase(
    ctx,
    actor,
    {
      title: file.title,
      body: file.body,
      platformId: platformId ?? null,
      vehicle: file.vehicle
        ? { vin: file.vehicle.vin, plate: file.vehicle.plate ?? undefined, mileage: file.vehicle.mileage ?? undefined, mileageUnit: file.vehicle.mileageUnit ?? undefined, visitDate: file.vehicle.visitDate ?? undefined }
        : null,
      codes: file.codes,
      symptoms: file.symptoms,
      context: file.context,
      rootCause: file.rootCause ?? null,
      fix: file.fix ?? null,
      cause: file.cause ?? null,
      status: file.status,
    },
    {
      slug: file.slug,
      createdAt: new Date(`${file.created}T09:00:00Z`),
      confirmation: file.confirmed && confirmer ? { byId: confirmer.id, at: new Date(`${file.confirmed.date}T17:00:00Z`), note: file.confirmed.note ?? null } : null,
      skipEmail: true,
    },
  );
}

export async function exportCase(ctx: AppContext, actor: Actor, id: number): Promise<{ fileName: string; text: string }> {
  const row = await loadVisibleCase(ctx.db, actor, id);
  const [author] = await ctx.db.select({ handle: users.handle, email: users.email }).from(users).where(eq(users.id, row.authorId));
  const [confirmer] = row.confirmedById ? await ctx.db.select({ handle: users.handle, email: users.email }).from(users).where(eq(users.id, row.confirmedById)) : [];
  const [platform] = row.platformId ? await ctx.db.select({ key: platforms.key }).from(platforms).where(eq(platforms.id, row.platformId)) : [];
  const [vehicle] = row.vehicleId ? await ctx.db.select().from(vehicles).where(and(eq(vehicles.id, row.vehicleId), eq(vehicles.shopId, actor.shopId))) : [];
  if (!author) throw badRequest('The case has no author.');
  const slug = row.slug ?? `case-${row.id}`;
  const who = (p: { handle: string | null; email: string }) => p.handle ?? p.email;
  const file: CaseFile = {
    slug,
    title: row.title,
    platform: platform?.key ?? null,
    codes: row.codes,
    symptoms: row.symptoms,
    context: row.context,
    status: row.status,
    author: who(author),
    rootCause: row.rootCause,
    cause: row.cause,
    fix: row.fix,
    confirmed: row.confirmedAt && confirmer ? { by: who(confirmer), date: row.confirmedAt.toISOString().slice(0, 10), note: row.confirmNote } : false,
    vehicle: vehicle
      ? { vin: vehicle.vin, plate: vehicle.plate ?? undefined, mileage: row.mileage ?? undefined, mileageUnit: row.mileageUnit ?? undefined, visitDate: row.visitDate ?? undefined }
      : undefined,
    created: row.createdAt.toISOString().slice(0, 10),
    body: row.body,
  };
  return { fileName: `${slug}.md`, text: formatCaseFile(file) };
}
