// The shapes of account requests, shared by the server (validation) and the forms (limits, hints).
import { z } from 'zod'
import { ROLES } from '../permissions'

/** A required text field whose wrong type and absence each get their own plain message. */
const text = (missing: string, what: string) => z.string({
  error: issue => (issue.input === undefined ? missing : `${what} must be text.`),
})

export const PASSWORD_MIN = 10
export const PASSWORD_MAX = 200

export const EmailSchema = text('Enter your e-mail address.', 'The e-mail address')
  .trim()
  .min(1, { error: 'Enter your e-mail address.' })
  .max(254, { error: 'An e-mail address is at most 254 characters.' })
  .pipe(z.email({ error: 'Enter an e-mail address like name@example.test.' }))

export const NameSchema = text('Enter a name.', 'The name')
  .trim()
  .min(1, { error: 'Enter a name.' })
  .max(120, { error: 'A name is at most 120 characters.' })

export const NewPasswordSchema = text('Choose a password.', 'The password')
  .min(PASSWORD_MIN, { error: `A password needs at least ${PASSWORD_MIN} characters.` })
  .max(PASSWORD_MAX, { error: `A password is at most ${PASSWORD_MAX} characters.` })

/** A password being checked (not chosen): only bounded, so a huge one cannot tie up the hasher. */
export const PasswordSchema = text('Enter your password.', 'The password')
  .min(1, { error: 'Enter your password.' })
  .max(PASSWORD_MAX, { error: `A password is at most ${PASSWORD_MAX} characters.` })

export const PracticeNameSchema = text('Name your practice.', 'The practice name')
  .trim()
  .min(2, { error: 'A practice name needs at least 2 characters.' })
  .max(120, { error: 'A practice name is at most 120 characters.' })

export const RoleSchema = z.enum(ROLES, { error: `Choose one of the roles: ${ROLES.join(', ')}.` })

/** Ids are nanoid strings; anything else cannot name a row. */
export const IdSchema = text('An id is missing.', 'An id').regex(/^[\w-]{1,64}$/, { error: 'This is not a valid id.' })

/** Link tokens are 43 url-safe characters; a tidy bound keeps junk out of the lookup. */
export const TokenSchema = text('The link token is missing.', 'The link token').regex(/^[\w-]{20,100}$/, { error: 'This link is not valid.' })

export const SignInBody = z.strictObject({ email: EmailSchema, password: PasswordSchema })
export const SignUpBody = z.strictObject({ name: NameSchema, email: EmailSchema, password: NewPasswordSchema, practiceName: PracticeNameSchema })
export const ForgotBody = z.strictObject({ email: EmailSchema })
export const ResetBody = z.strictObject({ token: TokenSchema, password: NewPasswordSchema })
export const InviteBody = z.strictObject({ email: EmailSchema, name: NameSchema.optional(), role: RoleSchema })
/** Accepting: a new person chooses a name and password; an existing account confirms its password (or is signed in). */
export const AcceptBody = z.strictObject({ name: NameSchema.optional(), password: PasswordSchema.optional() })
export const RoleChangeBody = z.strictObject({ role: RoleSchema })
export const SwitchPracticeBody = z.strictObject({ practiceId: IdSchema })
export const ProfileBody = z.strictObject({ name: NameSchema })
export const PasswordChangeBody = z.strictObject({ currentPassword: PasswordSchema, newPassword: NewPasswordSchema })
export const PracticeSettingsBody = z.strictObject({
  name: PracticeNameSchema.optional(),
  guideline: z.enum(['acc-aha-2017', 'esh-2023'], { error: 'Choose acc-aha-2017 or esh-2023.' }).optional(),
}).refine(body => body.name !== undefined || body.guideline !== undefined, { error: 'Send a name or a guideline to change.', path: ['name'] })

/** Where to go after signing in: only a path inside Lamina (never //host or a full URL). */
export function safeNext(value: unknown, fallback = '/'): string {
  if (typeof value !== 'string' || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return fallback
  return value.length > 500 ? fallback : value
}
