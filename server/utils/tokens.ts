import { createHash } from 'node:crypto'
import { nanoid } from 'nanoid'

/** A fresh link token (43 url-safe characters, ~256 bits). Only its hash is stored. */
export const newToken = () => nanoid(43)

/** SHA-256 of a token, hex: what the database keeps and looks up. */
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000
export const RESET_LIFETIME_MS = 60 * 60 * 1000
