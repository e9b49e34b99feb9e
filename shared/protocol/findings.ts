/** Where a finding points: track and block indexes (and the block's id when it has one). */
export interface FindingLocation {
  track?: number
  block?: number
  set?: number
  blockId?: string
}

/** One RFC 6902 operation on the protocol document. */
export interface PatchOp {
  op: 'add' | 'replace' | 'remove'
  path: string
  value?: unknown
}

export type Severity = 'error' | 'warning' | 'info'

/** One thing the validator noticed. `error` blocks save, approval and assignment. */
export interface Finding {
  rule: string
  severity: Severity
  message: string
  location: FindingLocation
  fix?: { message: string, patch?: PatchOp[] }
  source?: string
  caution: string
}

/** Shown with every finding. */
export const STANDARD_CAUTION = 'Lamina supports, and does not replace, medical advice and licensed practice. Follow the client\'s clinician and your local codes of practice.'

/** Shown with contraindication findings before the standard caution. */
export const HEALTH_CAUTION = 'Stop the session and seek medical help if the client feels chest pain, faintness, a sudden headache or unusual breathlessness.'
