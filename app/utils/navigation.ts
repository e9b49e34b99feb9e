import type { Action } from '#shared/permissions'

/** One entry of the app shell's navigation; shown only to roles allowed `action`. */
export interface NavItem {
  to: string
  label: string
  action: Action
}

// Each area adds its entry here when its page exists; the shell never links to an empty page.
export const NAV_ITEMS: NavItem[] = [
  { to: '/studio', label: 'Studio', action: 'templates.view' },
  { to: '/members', label: 'Members', action: 'members.view' },
]
