import { z } from 'zod';

/** Every role a person can hold; a person may hold several. */
export const ROLES = ['designer', 'catalogue_manager', 'sales', 'operations', 'admin'] as const;

/** One role. */
export const RoleSchema = z.enum(ROLES, {
  error: 'Choose a role: Designer, Catalogue manager, Sales, Operations or Admin.',
});
/** One role. */
export type Role = z.infer<typeof RoleSchema>;

/** Human labels for the roles, used by the client and the CLI. */
export const ROLE_LABELS: Record<Role, string> = {
  designer: 'Designer',
  catalogue_manager: 'Catalogue manager',
  sales: 'Sales',
  operations: 'Operations',
  admin: 'Admin',
};

/** E-mail as people type it: trimmed, lower-cased, at most 254 characters. */
export const EmailSchema = z.string().trim().toLowerCase().max(254).pipe(z.email());

/** Body of `POST /api/auth/sign-in`. */
export const SignInSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'Enter your password.').max(256),
});
/** Body of `POST /api/auth/sign-in`. */
export type SignIn = z.infer<typeof SignInSchema>;

/** A new password: at least 10 characters, never trimmed (spaces are part of a password). */
export const NewPasswordSchema = z
  .string()
  .min(10, 'The password needs at least 10 characters.')
  .max(256, 'A password can be at most 256 characters long.');

/** A person as the API shows them (never the password hash). */
export const PersonSchema = z.object({
  id: z.string(),
  email: z.string(),
  /** Trimmed first, so a name of spaces only is refused. */
  name: z.string().trim().min(1, 'Give the person a name.').max(120, 'A name can be at most 120 characters long.'),
  roles: z.array(RoleSchema).min(1),
});
/** A person as the API shows them. */
export type Person = z.infer<typeof PersonSchema>;

/** Body of `POST /api/people` (admin). */
export const PersonCreateSchema = PersonSchema.pick({ name: true, roles: true }).extend({
  email: EmailSchema,
  /** Never trimmed: spaces are part of a password. */
  password: NewPasswordSchema,
});
/** Body of `POST /api/people` (admin). */
export type PersonCreate = z.infer<typeof PersonCreateSchema>;

/** Body of `PATCH /api/people/:id` (admin). */
export const PersonUpdateSchema = PersonSchema.pick({ name: true, roles: true }).partial();
/** Body of `PATCH /api/people/:id` (admin). */
export type PersonUpdate = z.infer<typeof PersonUpdateSchema>;

/** A person as the admin's people list shows them: also whether they may sign in. */
export const StudioPersonSchema = PersonSchema.extend({
  /** False once an admin deactivated them: they cannot sign in. */
  active: z.boolean(),
  /** When they were deactivated (ISO 8601), null while active. */
  deactivatedAt: z.string().nullable(),
});
/** A person in the admin's people list. */
export type StudioPerson = z.infer<typeof StudioPersonSchema>;

/** Body of `POST /api/auth/password`: the signed-in person changes their own password. */
export const PasswordChangeSchema = z
  .object({
    currentPassword: z.string().min(1, 'Enter your current password.').max(256),
    newPassword: NewPasswordSchema,
  })
  .refine((body) => body.newPassword !== body.currentPassword, {
    path: ['newPassword'],
    message: 'Choose a new password that differs from the current one.',
  });
/** Body of `POST /api/auth/password`. */
export type PasswordChange = z.infer<typeof PasswordChangeSchema>;

/** Answer of `POST /api/people/:id/reset-password`: the generated password, shown to the admin once. */
export const PasswordResetAnswerSchema = z.object({ person: StudioPersonSchema, password: z.string() });
/** Answer of `POST /api/people/:id/reset-password`. */
export type PasswordResetAnswer = z.infer<typeof PasswordResetAnswerSchema>;

/**
 * Answer of `GET /api/auth/me` and `POST /api/auth/sign-in`: the person, the name of their studio and the locale
 * (BCP 47 tag) the studio writes figures in.
 */
export const MeSchema = z.object({ person: PersonSchema, studioName: z.string(), locale: z.string() });
/** Answer of `GET /api/auth/me`. */
export type Me = z.infer<typeof MeSchema>;
