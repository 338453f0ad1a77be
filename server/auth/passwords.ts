import bcrypt from 'bcryptjs'

/** bcrypt hashes; the cost comes from the config and is never below 12. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost)
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash)
}

/**
 * A hash to compare against when the e-mail is unknown, so an unknown account costs as much time
 * as a wrong password and the two cannot be told apart.
 */
export function decoyHash(cost: number): string {
  return bcrypt.hashSync('decoy-password-never-matches', cost)
}
