// The shop's own settings: name, where it is (country, time zone) and its comeback window.
import { z } from 'zod';
import { countryName, isTimeZone } from '../shop-time';

export const shopSettingsSchema = z.object({
  name: z.string(),
  country: z.string().nullable(),
  countryName: z.string().nullable(),
  timeZone: z.string(),
  comebackDays: z.number(),
  comebackKm: z.number(),
  /** The day it is now in the shop's zone. */
  today: z.string(),
  /** Rules the app applies that hold only in some regions, worded for this shop. */
  regionalNotes: z.array(z.string()),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;
export const shopResponseSchema = z.object({ shop: shopSettingsSchema });

export const shopPatchSchema = z
  .strictObject({
    name: z.string({ error: 'The shop name is text.' }).trim().min(2, 'Enter the shop name (at least 2 characters).').max(120, 'The shop name is at most 120 characters.'),
    country: z
      .string({ error: 'The country is a two-letter ISO 3166 code such as NZ or PT.' })
      .trim()
      .toUpperCase()
      .refine((c) => countryName(c) !== null, 'Use a two-letter ISO 3166 country code such as NZ, PT or CA.')
      .nullable(),
    timeZone: z
      .string({ error: 'The time zone is a name such as Europe/Lisbon.' })
      .trim()
      .refine(isTimeZone, 'Use a time zone name such as Europe/Lisbon, Pacific/Auckland or America/Chicago.'),
    comebackDays: z.number({ error: 'The comeback window in days is a number.' }).int('Whole days only.').min(1, 'At least 1 day.').max(730, 'At most 730 days.'),
    comebackKm: z.number({ error: 'The comeback window in km is a number.' }).int('Whole kilometres only.').min(1, 'At least 1 km.').max(100_000, 'At most 100,000 km.'),
  })
  .partial()
  .refine((p) => Object.keys(p).length > 0, 'Send at least one setting to change.');
export type ShopPatch = z.infer<typeof shopPatchSchema>;
