import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

// The same scrypt driver and defaults nuxt-auth-utils' hashPassword uses, so hashes
// made outside the server (seed, tests) verify with verifyPassword inside it.
const hasher = new Hash(new Scrypt({}))

/** Hashes a password outside Nitro (scripts and tests). */
export const hashPasswordOffline = (password: string) => hasher.make(password)
