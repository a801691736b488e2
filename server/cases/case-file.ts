// The case file format of content/cases (Markdown + YAML front matter, documented in
// content/cases/README.md): parse it for import and write it back for export.
import matter from 'gray-matter';
import YAML from 'yaml';
import { z } from 'zod';
import { caseStatusSchema, dtcInputSchema, tagSchema, vinInputSchema } from '../../shared/schemas/cases';

// YAML 1.2 (the yaml package) keeps bare dates as strings; accept Date objects from YAML 1.1 files too.
const dateString = z.union([z.string(), z.date()]).transform((v) => (v instanceof Date ? v.toISOString().slice(0, 10) : v)).pipe(z.iso.date());

export const caseFileSchema = z.object({
  slug: z.string().regex(/^[a-z0-9-]+$/, 'slug is kebab-case'),
  title: z.string().min(3).max(200),
  platform: z.string().nullable().optional(),
  codes: z.array(dtcInputSchema).default([]),
  symptoms: z.array(tagSchema).default([]),
  context: z.array(tagSchema).default([]),
  status: caseStatusSchema,
  author: z.string(),
  rootCause: z.string().nullable().optional(),
  cause: z.string().nullable().optional(),
  fix: z.string().nullable().optional(),
  confirmed: z.union([z.literal(false), z.object({ by: z.string(), date: dateString, note: z.string().nullable().optional() })]).default(false),
  vehicle: z
    .object({
      vin: vinInputSchema,
      plate: z.string().nullable().optional(),
      mileage: z.number().int().min(0).nullable().optional(),
      mileageUnit: z.enum(['km', 'mi']).nullable().optional(),
      visitDate: dateString.nullable().optional(),
    })
    .nullable()
    .optional(),
  created: dateString,
});
export type CaseFile = z.infer<typeof caseFileSchema> & { body: string };

const engines = { yaml: { parse: (s: string) => YAML.parse(s) as object, stringify: (o: object) => YAML.stringify(o) } };

export class CaseFileError extends Error {}

export function parseCaseFile(text: string, fileName = 'case'): CaseFile {
  const parsed = matter(text, { engines, language: 'yaml' });
  const result = caseFileSchema.safeParse(parsed.data);
  if (!result.success) {
    const problems = result.error.issues.map((i) => `${i.path.join('.') || 'front matter'}: ${i.message}`).join('; ');
    throw new CaseFileError(`${fileName}: ${problems}`);
  }
  return { ...result.data, body: parsed.content.replace(/^\n/, '') };
}

/** Writes a case file; keys in the documented order, empty optional fields left out. */
export function formatCaseFile(file: CaseFile): string {
  const { body, ...data } = file;
  const ordered: Record<string, unknown> = {};
  const keys = ['slug', 'title', 'platform', 'codes', 'symptoms', 'context', 'status', 'author', 'rootCause', 'cause', 'fix', 'confirmed', 'vehicle', 'created'] as const;
  for (const k of keys) {
    const v = data[k];
    if (v === undefined || v === null) continue;
    if (k === 'context' && Array.isArray(v) && v.length === 0) continue;
    ordered[k] = v;
  }
  return `---\n${YAML.stringify(ordered, { lineWidth: 0 })}---\n${body}`;
}
