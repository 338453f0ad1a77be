import { Foundation1764633600000 } from './1764633600000-foundation'

/** Every migration in order. A new migration is added here as well as in its own file. */
export const MIGRATIONS = [Foundation1764633600000]
