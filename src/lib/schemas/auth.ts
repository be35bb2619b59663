import { z } from 'zod';

export const EmailSchema = z
  .string({ required_error: 'Enter your e-mail address.' })
  .trim()
  .min(3, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .email('Enter a valid e-mail address, like name@lab.example.')
  .transform((e) => e.toLowerCase());

export const NewPasswordSchema = z
  .string({ required_error: 'Choose a password.' })
  .min(10, 'Use at least 10 characters.')
  .max(256, 'Use at most 256 characters.');

export const DisplayNameSchema = z
  .string({ required_error: 'Enter your name.' })
  .trim()
  .min(1, 'Enter your name.')
  .max(80, 'Use at most 80 characters.');

export const SignUpSchema = z.object({ email: EmailSchema, password: NewPasswordSchema, name: DisplayNameSchema });
export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string({ required_error: 'Enter your password.' }).min(1, 'Enter your password.').max(256),
});
export const TokenSchema = z.string({ required_error: 'The link is incomplete.' }).min(20, 'The link is incomplete.').max(200);
export const VerifySchema = z.object({ token: TokenSchema });
export const ResetRequestSchema = z.object({ email: EmailSchema });
export const ResetSchema = z.object({ token: TokenSchema, password: NewPasswordSchema });
export const ChangePasswordSchema = z.object({
  currentPassword: z.string({ required_error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(256),
  newPassword: NewPasswordSchema,
});
export const UpdateProfileSchema = z.object({ name: DisplayNameSchema });

export type SignUpInput = z.input<typeof SignUpSchema>;
export type SignInInput = z.input<typeof SignInSchema>;
