// Lamina's one permission model: what each role in a practice may do.
// The server checks it on every route (server/utils/auth.ts); the client reads the
// same table only to show or hide actions. The server is the authority.

export const ROLES = ['owner', 'senior_coach', 'junior_coach', 'reviewer', 'client'] as const
export type Role = (typeof ROLES)[number]

/** Plain names for the roles, as the trade says them. */
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  senior_coach: 'Senior coach',
  junior_coach: 'Junior coach',
  reviewer: 'Reviewer',
  client: 'Client',
}

/** One line per role for the invite form and the members page. */
export const ROLE_SUMMARIES: Record<Role, string> = {
  owner: 'Runs the practice: members, roles and settings, plus everything a senior coach does.',
  senior_coach: 'Designs templates, submits them for review and assigns plans to clients.',
  junior_coach: 'Clones and adapts approved templates and prepares client plans.',
  reviewer: 'Approves templates or sends them back with comments (never their own).',
  client: 'Sees their own plans, runs their sessions and logs effort and blood pressure.',
}

const staff: Role[] = ['owner', 'senior_coach', 'junior_coach', 'reviewer']
const coaches: Role[] = ['owner', 'senior_coach', 'junior_coach']
const seniors: Role[] = ['owner', 'senior_coach']
const owners: Role[] = ['owner']

/** Every action a route or a screen can ask about, with the roles allowed to do it. */
export const ACTIONS = {
  /** Run the shared protocol engine (analysis, blood-pressure and intensity helpers). */
  'engine.use': [...ROLES],
  /** Browse the block library. */
  'library.view': staff,
  /** Add or change the practice's own blocks. */
  'blocks.manage': seniors,
  'templates.view': staff,
  'templates.create': seniors,
  /** Start a new template from an approved version. */
  'templates.clone': coaches,
  'templates.edit': coaches,
  'templates.submit': coaches,
  /** Approve or return a version; never one's own (checked where the review happens). */
  'templates.review': ['reviewer'],
  'clients.view': coaches,
  'clients.manage': coaches,
  /** Invite a person as a client of the practice. */
  'clients.invite': coaches,
  'plans.prepare': coaches,
  'plans.assign': seniors,
  /** See and log one's own plan (as the client it belongs to). */
  'plans.own': ['client'],
  'members.view': owners,
  'members.manage': owners,
  /** Invite a person with any role. */
  'members.invite': owners,
  'practice.settings': owners,
  'audit.view': owners,
} as const satisfies Record<string, readonly Role[]>

export type Action = keyof typeof ACTIONS
export const ACTION_NAMES = Object.keys(ACTIONS) as Action[]

/** Plain words for an action, used in refusals ("Your role … may not …"). */
export const ACTION_LABELS: Record<Action, string> = {
  'engine.use': 'use the protocol tools',
  'library.view': 'browse the block library',
  'blocks.manage': 'manage the practice\'s blocks',
  'templates.view': 'see templates',
  'templates.create': 'create templates',
  'templates.clone': 'clone approved templates',
  'templates.edit': 'edit templates',
  'templates.submit': 'submit templates for review',
  'templates.review': 'review templates',
  'clients.view': 'see clients',
  'clients.manage': 'manage clients',
  'clients.invite': 'invite clients',
  'plans.prepare': 'prepare plans',
  'plans.assign': 'assign plans to clients',
  'plans.own': 'keep a plan of their own',
  'members.view': 'see the practice\'s members',
  'members.manage': 'change members\' roles or remove members',
  'members.invite': 'invite members',
  'practice.settings': 'change the practice\'s settings',
  'audit.view': 'read the audit log',
}

/** True when `role` may perform `action`; no role (not a member) may do nothing. */
export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false
  return (ACTIONS[action] as readonly Role[]).includes(role)
}

/** Every action `role` may perform, in table order. */
export function permissionsOf(role: Role | null | undefined): Action[] {
  return ACTION_NAMES.filter(action => can(role, action))
}

/** The roles a member with `role` may hand out in an invitation. */
export function invitableRoles(role: Role | null | undefined): Role[] {
  if (can(role, 'members.invite')) return [...ROLES]
  if (can(role, 'clients.invite')) return ['client']
  return []
}

export const isRole = (value: unknown): value is Role => typeof value === 'string' && (ROLES as readonly string[]).includes(value)
