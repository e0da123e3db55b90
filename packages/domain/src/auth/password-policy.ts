import { z } from 'zod';
import { nameSchema } from '../text/name-text.rules';

/** NIST SP 800-63B asks for at least 8 characters and no composition rules; we ask for 10. */
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }));

export const signInSchema = z.object({ email: emailSchema, password: z.string().min(1).max(200) });
export const signUpSchema = z.object({
  shopName: nameSchema(2, 80),
  name: nameSchema(1, 80),
  email: emailSchema,
  password: passwordSchema,
});
export const acceptInvitationSchema = z.object({
  name: nameSchema(1, 80),
  password: passwordSchema,
});
export const resetRequestSchema = z.object({ email: emailSchema });
export const resetConfirmSchema = z.object({ token: z.string().min(20).max(200), password: passwordSchema });
