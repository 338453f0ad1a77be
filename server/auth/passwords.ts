import { availableParallelism } from 'node:os'
import bcrypt from 'bcryptjs'
import { Piscina } from 'piscina'
import type { PasswordTask } from './password-worker'

/**
 * bcrypt hashes; the cost comes from the config and is never below 12. At cost 12 one hash is about
 * a quarter of a second of CPU, so hashing and checking run on worker threads (piscina): on the
 * API's own thread every sign-in held up all other requests meanwhile.
 */
let threads: Piscina | undefined

function passwordThreads(): Piscina {
  threads ??= new Piscina({
    filename: new URL('./password-worker.ts', import.meta.url).href,
    // the threads load TypeScript as the API process does; idle threads end and never keep a process alive
    execArgv: ['--import', 'tsx'],
    maxThreads: availableParallelism(),
    idleTimeout: 60_000,
  })
  return threads
}

export function hashPassword(password: string, cost: number): Promise<string> {
  return passwordThreads().run({ kind: 'hash', password, cost } satisfies PasswordTask) as Promise<string>
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return passwordThreads().run({ kind: 'verify', password, hash } satisfies PasswordTask) as Promise<boolean>
}

/**
 * A hash to compare against when the e-mail is unknown, so an unknown account costs as much time
 * as a wrong password and the two cannot be told apart. Made once when the API starts.
 */
export function decoyHash(cost: number): string {
  return bcrypt.hashSync('decoy-password-never-matches', cost)
}
