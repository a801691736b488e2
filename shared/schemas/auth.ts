import { z } from 'zod';
import { roles } from '../roles';

// ASVS 5.0 6.2.1 / 6.2.9: at least 8 characters, allow at least 64 (we allow 128).
export const PASSWORD_MIN = 8;
export const PASSWORD_RECOMMENDED = 15;
export const PASSWORD_MAX = 128;

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters (${PASSWORD_RECOMMENDED} or more is better).`)
  .max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`);

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }));

const nameSchema = z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(120, 'Use at most 120 characters.');

export const signupSchema = z.strictObject({
  shopName: z.string({ error: 'Enter the shop name.' }).trim().min(2, 'Enter the shop name.').max(120),
  name: nameSchema,
  email: emailSchema,
});

export const loginSchema = z.strictObject({
  email: z.string({ error: 'Enter your e-mail address.' }).trim().toLowerCase().min(1, 'Enter your e-mail address.').max(254),
  password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(1024),
});

export const roleSchema = z.enum(roles, { error: `Role must be one of: ${roles.join(', ')}.` });

export const userSchema = z.object({
  id: z.number(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  shopId: z.number(),
  shopName: z.string(),
  shopCountry: z.string().nullable(),
  shopTimeZone: z.string(),
});
export type UserView = z.infer<typeof userSchema>;

export const meResponseSchema = z.object({ user: userSchema });

export const shopUserSchema = z.object({
  id: z.number(),
  name: z.string(),
  email: z.string(),
  role: roleSchema,
  disabled: z.boolean(),
  invited: z.boolean(),
  createdAt: z.string(),
});
export type ShopUser = z.infer<typeof shopUserSchema>;
export const usersResponseSchema = z.object({ users: z.array(shopUserSchema) });

export const inviteSchema = z.strictObject({ name: nameSchema, email: emailSchema, role: roleSchema });

export const userPatchSchema = z
  .strictObject({ role: roleSchema.optional(), disabled: z.boolean({ error: 'disabled must be true or false.' }).optional() })
  .refine((v) => v.role !== undefined || v.disabled !== undefined, { message: 'Send role or disabled.' });

export const resetRequestSchema = z.strictObject({ email: emailSchema });

export const setPasswordSchema = z.strictObject({
  token: z.string({ error: 'The link is missing its token.' }).regex(/^[A-Za-z0-9_-]{20,100}$/, 'That link is not valid.'),
  password: passwordSchema,
});

export const idParamsSchema = z.object({
  id: z.coerce.number({ error: 'The id must be a number.' }).int('The id must be a whole number.').positive('The id must be positive.').max(Number.MAX_SAFE_INTEGER),
});
