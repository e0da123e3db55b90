import { z } from 'zod';

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
  shopName: z.string().trim().min(2).max(80),
  name: z.string().trim().min(1).max(80),
  email: emailSchema,
  password: passwordSchema,
});
export const acceptInvitationSchema = z.object({
  name: z.string().trim().min(1).max(80),
  password: passwordSchema,
});
export const resetRequestSchema = z.object({ email: emailSchema });
export const resetConfirmSchema = z.object({ token: z.string().min(20).max(200), password: passwordSchema });
