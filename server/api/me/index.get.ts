import { ROLE_LABELS, permissionsOf } from '#shared/permissions'

// Who is signed in, their current practice and role, every practice they belong to, and what they may do.
export default defineEventHandler(async (event) => {
  const { user, membership } = await requireUser(event)
  const practices = await practicesOf(user.id)
  return {
    user,
    practice: membership ? { id: membership.practice.id, name: membership.practice.name, guideline: membership.practice.guideline } : null,
    role: membership?.role ?? null,
    roleLabel: membership ? ROLE_LABELS[membership.role] : null,
    practices,
    permissions: permissionsOf(membership?.role),
  }
})
