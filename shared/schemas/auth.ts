import { z } from 'zod';
import { UnitSchema, listOf } from './common';

export const ROLES = ['admin', 'lead', 'programmer', 'reviewer', 'operator'] as const;
export const RoleSchema = z.enum(ROLES, { message: `Role must be one of ${ROLES.join(', ')}.` });
export type Role = z.infer<typeof RoleSchema>;

const email = z.string({ message: 'E-mail address is required.' }).trim().toLowerCase().email('Enter a valid e-mail address, like name@example.com.').max(254);

export const LoginInputSchema = z.object({
  email,
  password: z.string({ message: 'Password is required.' }).min(1, 'Password is required.').max(200),
});
export type LoginInput = z.infer<typeof LoginInputSchema>;

export const UserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  active: z.boolean(),
  displayUnit: UnitSchema.nullable(),
  /** Invited and no password chosen yet; such a user cannot sign in. */
  invited: z.boolean(),
  createdAt: z.string(),
});
export type User = z.infer<typeof UserSchema>;
export const UserListSchema = listOf(UserSchema);

export const PasswordSchema = z.string({ message: 'Choose a password of at least 10 characters.' }).min(10, 'Choose a password of at least 10 characters.').max(200, 'Passwords are limited to 200 characters.');

export const CreateUserInputSchema = z.object({
  email,
  name: z.string().trim().min(1, 'Name is required.').max(120),
  role: RoleSchema,
  password: PasswordSchema,
});
export type CreateUserInput = z.infer<typeof CreateUserInputSchema>;

/** The admin invites; the user chooses the password from the link in the mail. */
export const InviteUserInputSchema = CreateUserInputSchema.omit({ password: true });
export type InviteUserInput = z.infer<typeof InviteUserInputSchema>;

export const SetPasswordInputSchema = z.object({
  token: z.string({ message: 'The link is incomplete; open it again from the mail.' }).min(1, 'The link is incomplete; open it again from the mail.').max(200, 'The link is not one Gridset sent; open it again from the mail.'),
  password: PasswordSchema,
});
export type SetPasswordInput = z.infer<typeof SetPasswordInputSchema>;

export const ForgotPasswordInputSchema = z.object({ email });
export type ForgotPasswordInput = z.infer<typeof ForgotPasswordInputSchema>;

export const UpdateUserInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name is required.').max(120).optional(),
    role: RoleSchema.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one of name, role or active.');
export type UpdateUserInput = z.infer<typeof UpdateUserInputSchema>;

export const UpdateMeInputSchema = z.object({ displayUnit: UnitSchema.nullable() });

/**
 * What each role may do: the one table of roles. The server's routes declare their access from it,
 * the client hides controls it would refuse, and the README's Roles table must equal it
 * (tests/shared/roles-readme.test.ts compares the two).
 */
export const CAN = {
  editCatalog: ['lead', 'programmer'] as Role[],
  deleteCatalog: ['lead'] as Role[],
  editTemplates: ['lead', 'programmer'] as Role[],
  releaseTemplates: ['lead'] as Role[],
  signOff: ['lead', 'reviewer'] as Role[],
  editNaming: ['lead'] as Role[],
  editSettings: ['admin', 'lead'] as Role[],
  manageUsers: ['admin'] as Role[],
  readOutbox: ['admin'] as Role[],
  readAudit: ['admin', 'lead'] as Role[],
  editJobs: ['lead', 'programmer'] as Role[],
  uploadPartPrograms: ['lead', 'programmer'] as Role[],
  recordBars: ['lead', 'programmer', 'operator'] as Role[],
  editLoadLists: ['lead', 'programmer', 'operator'] as Role[],
  backups: ['admin'] as Role[],
} as const;
export type Action = keyof typeof CAN;

/** How the README's Roles table names each action (one row per action). */
export const ACTION_WORDS: Record<Action, string> = {
  editCatalog: 'catalog: create and edit',
  deleteCatalog: 'catalog: delete',
  editTemplates: 'templates: edit, submit for review',
  releaseTemplates: 'templates: release, retire',
  signOff: 'reviews: approve, request changes',
  editNaming: 'naming convention: edit',
  editSettings: 'shop settings: edit',
  manageUsers: 'users: invite, add, change role, deactivate',
  readOutbox: 'outbox: read',
  readAudit: 'audit trail: read',
  editJobs: 'jobs: create and edit',
  uploadPartPrograms: 'part programs: upload',
  recordBars: 'measured bars: record',
  editLoadLists: 'load lists: edit',
  backups: 'backups',
};
export const may = (role: Role | undefined, action: Action) => !!role && CAN[action].includes(role);
