import { z } from 'zod';

export const emailSchema = z.string().trim().toLowerCase().email('Enter a valid email address').max(254);

// Sign-in checks shape only; the generic "wrong email or password" comes from the server.
export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(1024),
});
export type SignInInput = z.infer<typeof signInSchema>;

// Passwords people choose: long enough to resist guessing, no composition rules (NIST SP 800-63B §5.1.1).
export const newPasswordSchema = z.string().min(12, 'Use at least 12 characters').max(1024);
