import type { Action } from '#shared/permissions'

/** One entry of the app shell's navigation; shown only to roles allowed `action`. */
export interface NavItem {
  to: string
  label: string
  /** One line on the home page saying what the area is for. */
  description: string
  action: Action
}

// Each area adds its entry here when its page exists; the shell never links to an empty page.
export const NAV_ITEMS: NavItem[] = [
  { to: '/studio', label: 'Studio', description: 'Compose protocols from holds, breathing and rests, with the analysis as you edit.', action: 'templates.view' },
  { to: '/bp-check', label: 'Blood pressure', description: 'Categories, averages and the home-monitoring average of a set of readings.', action: 'engine.use' },
  { to: '/members', label: 'Members', description: 'The people of the practice, their roles, and invitations.', action: 'members.view' },
  { to: '/practice', label: 'Practice', description: 'The practice\'s name and the blood-pressure guideline it follows.', action: 'practice.settings' },
]
