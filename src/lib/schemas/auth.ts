/** Client-side checks for the sign-in forms; better-auth validates again on the server. */
import { z } from 'zod';

export const PasswordSchema = z.string().min(10, 'Use at least 10 characters.').max(128, 'Use at most 128 characters.');
export const SignUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(80),
  email: z.email('Enter a valid e-mail address.').trim().toLowerCase(),
  password: PasswordSchema,
});
export const SignInSchema = z.object({ email: z.email('Enter a valid e-mail address.').trim().toLowerCase(), password: z.string().min(1, 'Enter your password.') });
export const ResetRequestSchema = z.object({ email: z.email('Enter a valid e-mail address.').trim().toLowerCase() });
export const ResetSchema = z.object({ password: PasswordSchema, confirm: z.string() }).refine((v) => v.password === v.confirm, { message: 'The two passwords differ.', path: ['confirm'] });
