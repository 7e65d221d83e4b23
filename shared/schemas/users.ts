import { z } from 'zod';
import { ROLES } from '../roles';
import { emailSchema, newPasswordSchema } from './auth';

export const roleSchema = z.enum(ROLES, { message: `Role must be one of: ${ROLES.join(', ')}` });

export const createUserSchema = z.object({
  email: emailSchema,
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role: roleSchema,
  password: newPasswordSchema,
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    role: roleSchema.optional(),
    disabled: z.boolean().optional(),
  })
  .strict()
  .refine((v) => v.role !== undefined || v.disabled !== undefined, {
    message: 'Nothing to change: give role or disabled',
  });
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const idParamSchema = z.object({ id: z.coerce.number().int().positive('id must be a positive whole number') });

export interface UserView {
  id: number;
  email: string;
  name: string;
  role: (typeof ROLES)[number];
  disabled: boolean;
  createdAt: string;
  lastSignInAt: string | null;
}
