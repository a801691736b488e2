// The trouble-code, VIN and scan-report API contract: what clients send and what the server answers.
import { z } from 'zod';
import { readinessSchema } from './readiness';

// ---- requests ----

export const dtcSystems = ['powertrain', 'chassis', 'body', 'network'] as const;

/** The raw path segment; the service parses it so a malformed code answers with its reason. */
export const codeParamsSchema = z.object({
  code: z.string().trim().min(1, 'Enter a trouble code, e.g. P0302.').max(20, 'A trouble code is at most 8 characters (P0302-13).'),
});

export const decodeQuerySchema = z.object({
  pairs: z
    .string({ error: 'Give the bytes as hex in pairs, e.g. pairs=0133C100.' })
    .max(512, 'At most 512 hex digits (128 codes) at a time.')
    .transform((s) => s.replace(/\s+/g, '').toUpperCase())
    .pipe(
      z
        .string()
        .min(1, 'Give the bytes as hex in pairs, e.g. pairs=0133C100.')
        .regex(/^[0-9A-F]*$/, 'Only hex digits 0-9 and A-F (spaces are ignored).')
        .refine((s) => s.length % 2 === 0, 'Odd number of hex digits: each byte is two digits.')
        .refine((s) => s.length % 4 === 0, 'Each code takes two bytes (4 hex digits).'),
    ),
});

export const codeListQuerySchema = z.object({
  q: z.string().trim().max(100, 'Search is at most 100 characters.').default(''),
  system: z.enum(dtcSystems, { error: 'system must be powertrain, chassis, body or network.' }).optional(),
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, 'page starts at 1.').max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type CodeListQuery = z.infer<typeof codeListQuerySchema>;

export const vinParamsSchema = z.object({
  vin: z.string().max(64, 'That is far too long for a VIN (17 characters).'),
});

/** JSON form of a scan report upload; the multipart form sends `file` instead. */
export const scanReportBodySchema = z.strictObject({
  text: z.string({ error: 'Send the report as text in "text", or upload it as "file".' }),
});

// ---- responses ----

export const ftbSchema = z.object({ value: z.string(), category: z.string(), meaning: z.string().nullable() });

/** One character (or run) of a code and what it says. */
export const codePartSchema = z.object({ chars: z.string(), position: z.string(), meaning: z.string() });

export const codeDetailSchema = z.object({
  code: z.string(),
  /** 'P0302-13' with the FTB, else the code */
  full: z.string(),
  system: z.enum(dtcSystems),
  systemLabel: z.string(),
  scope: z.enum(['generic', 'manufacturer', 'reserved']),
  scopeLabel: z.string(),
  group: z.string().nullable(),
  groupLabel: z.string().nullable(),
  title: z.string().nullable(),
  titleNote: z.string(),
  /** J1979 service $03 byte pair, e.g. '0302' */
  pair: z.string(),
  misfire: z.object({ cylinder: z.number().nullable() }).nullable(),
  structure: z.array(codePartSchema),
  ftb: ftbSchema.optional(),
});
export type CodeDetail = z.infer<typeof codeDetailSchema>;

export const decodeResponseSchema = z.object({ codes: z.array(z.string()) });

export const codeListItemSchema = z.object({ code: z.string(), title: z.string(), system: z.enum(dtcSystems) });
export const codeListResponseSchema = z.object({
  codes: z.array(codeListItemSchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
  note: z.string(),
  /** set when q was a well-formed code: its detail page exists even if the reference has no title */
  exact: z.string().nullable(),
});
export type CodeListResponse = z.infer<typeof codeListResponseSchema>;

export const vinCheckSchema = z.object({
  vin: z.string(),
  valid: z.boolean(),
  checkDigit: z.string().nullable(),
  expectedCheckDigit: z.string().nullable(),
  wmi: z.string().nullable(),
  vds: z.string().nullable(),
  vis: z.string().nullable(),
  modelYears: z.array(z.number()),
  errors: z.array(z.string()),
  warnings: z.array(z.string()),
});
export type VinCheckView = z.infer<typeof vinCheckSchema>;

export const scanCodeStatuses = ['pending', 'confirmed', 'permanent', 'history', 'active'] as const;

export const scanReportResponseSchema = z.object({
  codes: z.array(
    z.object({
      code: z.string(),
      ftb: z.string().optional(),
      ftbMeaning: z.string().optional(),
      status: z.enum(scanCodeStatuses).optional(),
      title: z.string().optional(),
    }),
  ),
  vin: z.string().optional(),
  vinCheck: vinCheckSchema.optional(),
  mileage: z.object({ value: z.number(), unit: z.enum(['km', 'mi']) }).optional(),
  /** monitor status when the report holds it (a PID $01 answer or a monitor table) */
  readiness: readinessSchema.optional(),
});
export type ScanReportView = z.infer<typeof scanReportResponseSchema>;
