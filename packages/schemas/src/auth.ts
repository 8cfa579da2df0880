import { z } from 'zod';
import { limits } from './limits';

export const emailField = z
  .string({ error: 'Enter your e-mail address' })
  .trim()
  .toLowerCase()
  .max(limits.emailMax, `At most ${limits.emailMax} characters`)
  .pipe(z.email({ message: 'Enter a valid e-mail address' }));

export const passwordField = z
  .string({ error: 'Enter a password' })
  .min(limits.passwordMin, `Use at least ${limits.passwordMin} characters`)
  .max(limits.passwordMax, `At most ${limits.passwordMax} characters`);

export const displayNameField = z
  .string({ error: 'Enter your name' })
  .trim()
  .min(1, 'Enter your name')
  .max(limits.nameMax, `At most ${limits.nameMax} characters`);

export const AuthSignUpSchema = z.object({
  email: emailField,
  password: passwordField,
  name: displayNameField,
});
export type AuthSignUpInput = z.infer<typeof AuthSignUpSchema>;

export const AuthSignInSchema = z.object({
  email: emailField,
  password: z.string({ error: 'Enter your password' }).min(1, 'Enter your password').max(limits.passwordMax),
});
export type AuthSignInInput = z.infer<typeof AuthSignInSchema>;

export const PasswordResetRequestSchema = z.object({ email: emailField });
export type PasswordResetRequestInput = z.infer<typeof PasswordResetRequestSchema>;

export const PasswordResetConfirmSchema = z.object({
  token: z.string({ error: 'This reset link is not valid' }).min(20, 'This reset link is not valid').max(200),
  password: passwordField,
});
export type PasswordResetConfirmInput = z.infer<typeof PasswordResetConfirmSchema>;

export const unitSystems = ['metric', 'us'] as const;
export const temperatureUnits = ['C', 'F'] as const;
export const gravityUnits = ['sg', 'plato'] as const;

export const AccountUpdateSchema = z
  .object({
    name: displayNameField,
    unitSystem: z.enum(unitSystems),
    temperatureUnit: z.enum(temperatureUnits),
    gravityUnit: z.enum(gravityUnits),
    timeZone: z
      .string()
      .max(64)
      .refine((tz) => {
        try {
          new Intl.DateTimeFormat('en', { timeZone: tz });
          return true;
        } catch {
          return false;
        }
      }, 'Unknown time zone'),
  })
  .partial();
export type AccountUpdateInput = z.infer<typeof AccountUpdateSchema>;

/** Changing the password while signed in: the current one proves it is you; every other session ends. */
export const AccountPasswordChangeSchema = z.object({
  currentPassword: z
    .string({ error: 'Enter your current password' })
    .min(1, 'Enter your current password')
    .max(limits.passwordMax),
  newPassword: passwordField,
});
export type AccountPasswordChangeInput = z.infer<typeof AccountPasswordChangeSchema>;

/** The user as the API presents it. */
export interface UserDto {
  id: string;
  email: string;
  name: string;
  role: 'user' | 'admin';
  unitSystem: (typeof unitSystems)[number];
  temperatureUnit: (typeof temperatureUnits)[number];
  gravityUnit: (typeof gravityUnits)[number];
  timeZone: string;
  createdAt: string;
}

/** Every error response has this body. */
export interface ApiErrorBody {
  error: { code: string; message: string; requestId?: string; fields?: Record<string, string[]> };
}
