import { z } from 'zod';
import { requiredText } from './common';
import { emailSchema } from './membership';

export const signUpSchema = z.object({
  name: requiredText('Name', 80),
  email: emailSchema,
  password: z
    .string({ error: 'Password is required' })
    .min(10, 'Password must be at least 10 characters')
    .max(200, 'Password must be at most 200 characters'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Password is required').max(200, 'Password must be at most 200 characters'),
});

export const emailVerificationSchema = z.object({
  token: z.string({ error: 'Token is required' }).regex(/^[A-Za-z0-9_-]{20,100}$/, 'Token is not a confirmation token'),
});

export const passwordChangeSchema = z.object({
  currentPassword: z.string({ error: 'Current password is required' }).min(1, 'Current password is required').max(200, 'Password must be at most 200 characters'),
  newPassword: signUpSchema.shape.password,
});
export type PasswordChangeInput = z.infer<typeof passwordChangeSchema>;
