import { z } from 'zod';
import { ROLE_NAMES } from '../roles';
import { EmailSchema } from './auth';

export const RoleNameSchema = z.enum(ROLE_NAMES, { errorMap: () => ({ message: 'Choose buyer, seller, moderator or admin.' }) });

export const CreateLabSchema = z.object({
  name: z.string().trim().min(2, 'Give the lab a name.').max(120, 'Use at most 120 characters.'),
  institute: z.string().trim().min(2, 'Name the institute.').max(160, 'Use at most 160 characters.'),
  country: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{2}$/, 'Use the two-letter country code, like DE or US.'),
});

export const InviteSchema = z.object({ email: EmailSchema });
export const AcceptInviteSchema = z.object({ token: z.string().min(20, 'The link is incomplete.').max(200) });
export const RoleChangeSchema = z.object({ role: RoleNameSchema });
