// The invented demo scenario: a practice that does not exist, people who do not exist,
// addresses under the reserved example.test domain.
import type { Role } from './schema'

export const DEMO_PASSWORD = 'lamina-demo-2026'

export const DEMO_PRACTICE = { name: 'Tidewell Exercise Practice', slug: 'tidewell' } as const

export const DEMO_PEOPLE: ReadonlyArray<{ name: string, email: string, role: Role }> = [
  { name: 'Maren Ilves', email: 'maren.owner@tidewell.example.test', role: 'owner' },
  { name: 'Tobias Renk', email: 'tobias.senior@tidewell.example.test', role: 'senior_coach' },
  { name: 'Ada Quist', email: 'ada.junior@tidewell.example.test', role: 'junior_coach' },
  { name: 'Soren Halloway', email: 'soren.reviewer@tidewell.example.test', role: 'reviewer' },
  { name: 'Joel Marrow', email: 'joel.client@tidewell.example.test', role: 'client' },
]
