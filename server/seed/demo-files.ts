// Reads the demo shop, people and platforms from content/ and checks them with zod.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'yaml';
import { z } from 'zod';
import { roleSchema } from '../../shared/schemas/auth';
import { bankFiringWarnings, platformInputSchema } from '../../shared/platform';
import { isTimeZone } from '../../shared/shop-time';

export const DEMO_PASSWORD = 'causeway-demo-2026';

const shopFileSchema = z.object({
  shop: z.object({
    key: z.string(),
    name: z.string(),
    comebackDays: z.number().int().positive().default(90),
    comebackKm: z.number().int().positive().default(3000),
    country: z.string().regex(/^[A-Z]{2}$/).nullable().default(null),
    timeZone: z.string().refine(isTimeZone, 'timeZone must be an IANA zone name').default('UTC'),
  }).loose(),
  users: z.array(z.object({ key: z.string(), name: z.string(), email: z.string(), role: roleSchema })).min(4),
});

const platformFileSchema = z.array(z.object({ key: z.string() }).loose());

export type DemoShop = z.infer<typeof shopFileSchema>;

function readYaml(contentDir: string, file: string): unknown {
  return parse(readFileSync(path.join(contentDir, file), 'utf8'));
}

export function readDemoShop(contentDir: string): DemoShop {
  return shopFileSchema.parse(readYaml(contentDir, 'shop.yaml'));
}

export function readDemoPlatforms(contentDir: string) {
  const raw = readYaml(contentDir, 'platforms.yaml');
  const list = platformFileSchema.parse(Array.isArray(raw) ? raw : (raw as { platforms?: unknown })?.platforms);
  return list.map(({ key, ...rest }) => {
    const platform = platformInputSchema.parse(rest);
    // A form only warns about a bank map that does not fit the firing order; shipped content must be right.
    const warnings = bankFiringWarnings(platform);
    if (warnings.length) throw new Error(`content/platforms.yaml ${key}: ${warnings.join('; ')}`);
    return { key, ...platform };
  });
}
