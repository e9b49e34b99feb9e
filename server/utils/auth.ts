import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { ACTION_LABELS, ROLE_LABELS, can, type Action, type Role } from '#shared/permissions'
import { memberships, practices, users, type Role as DbRole } from '../db/schema'

// The database enum and the shared table must name the same roles.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : never) : never
const rolesAgree: Same<Role, DbRole> = true
void rolesAgree

/** Who is calling, in which practice, with which role; returned by requireMember. */
export interface MemberContext {
  user: { id: string, name: string, email: string }
  practice: { id: string, name: string, slug: string, guideline: 'acc-aha-2017' | 'esh-2023' }
  role: Role
  membershipId: string
}

/** A signed-in person, whether or not they are a member of their current practice. */
export interface UserContext {
  user: { id: string, name: string, email: string }
  practiceId: string | null
  membership: { id: string, role: Role, practice: MemberContext['practice'] } | null
}

/** The one sentence every refused action answers with. */
export function refusal(role: Role, action: Action) {
  return `Your role (${ROLE_LABELS[role]}) may not ${ACTION_LABELS[action]}.`
}

/**
 * Authenticates the caller (401 when anonymous or when the session was ended elsewhere)
 * and loads them and their membership of the session's practice from the database.
 */
export async function requireUser(event: H3Event): Promise<UserContext> {
  if (event.context.lamina?.userContext) return event.context.lamina.userContext
  const session = await getUserSession(event)
  if (!session.user?.id) throw createError({ status: 401, message: 'Sign in to continue.' })
  const practiceId = session.practiceId ?? null
  const [row] = await useDb()
    .select({
      user: { id: users.id, name: users.name, email: users.email, sessionVersion: users.sessionVersion },
      membershipId: memberships.id,
      role: memberships.role,
      practice: { id: practices.id, name: practices.name, slug: practices.slug, guideline: practices.guideline },
    })
    .from(users)
    .leftJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.practiceId, practiceId ?? '')))
    .leftJoin(practices, eq(practices.id, memberships.practiceId))
    .where(eq(users.id, session.user.id))
  if (!row || (session.secure?.version ?? 1) !== row.user.sessionVersion) {
    await clearUserSession(event)
    throw createError({ status: 401, message: 'Your session has ended. Sign in again.' })
  }
  const context: UserContext = {
    user: { id: row.user.id, name: row.user.name, email: row.user.email },
    practiceId,
    membership: row.membershipId && row.role && row.practice
      ? { id: row.membershipId, role: row.role, practice: row.practice }
      : null,
  }
  event.context.lamina = { ...event.context.lamina, userContext: context }
  return context
}

/**
 * Authenticates, loads the caller's membership of their current practice (fresh on every
 * request, so a removed member loses access at once) and checks `action` in the shared table.
 */
export async function requireMember(event: H3Event, action: Action): Promise<MemberContext> {
  const { user, membership } = await requireUser(event)
  if (!membership) {
    throw createError({
      status: 403,
      message: 'You are not a member of this practice. Choose another practice, or ask its owner for an invitation.',
    })
  }
  const context: MemberContext = { user, practice: membership.practice, role: membership.role, membershipId: membership.id }
  assertCan(context, action)
  return context
}

/** Throws 403 unless the member's role allows `action` (for checks that depend on the body). */
export function assertCan(context: MemberContext, action: Action) {
  if (!can(context.role, action)) throw createError({ status: 403, message: refusal(context.role, action) })
}

declare module 'h3' {
  interface H3EventContext {
    lamina?: { userContext?: UserContext }
  }
}
