import pg from 'pg'
import type { AuthUser } from './auth-user'

/** The channel the `users` trigger notifies with the id of every row updated or deleted (migration 1765065600000). */
export const USERS_CHANGED_CHANNEL = 'stringline_users_changed'
/** How long to wait before listening again after the connection was lost [ms]. */
const RELISTEN_MS = 1000

/**
 * The users this API process has seen on bearer tokens, so that a request does not read its user
 * row again — and forgets a user the moment PostgreSQL says the row changed (a trigger NOTIFYs on
 * every UPDATE and DELETE, delivered when the change commits), so deactivation and role changes
 * still apply at once. While the listening connection is down nothing is kept: every request reads
 * the row, as it would without this. A read that a change overtook is not kept either.
 */
export class SignedInUsers {
  private readonly users = new Map<string, AuthUser>()
  /** Bumped by every change and every lost connection; a read begun before a bump is not kept. */
  private generation = 0
  private client: pg.Client | null = null
  private relisten?: NodeJS.Timeout
  private stopped = false

  constructor(
    private readonly connectionString: string,
    private readonly onError: (err: unknown) => void = () => {},
  ) {}

  /** Starts listening; resolves once listening or once the first attempt failed (it keeps trying). */
  async start(): Promise<void> {
    const client = new pg.Client({ connectionString: this.connectionString, connectionTimeoutMillis: 2000 })
    client.on('notification', (message) => this.forget(message.payload ?? ''))
    client.once('error', (err) => this.lost(client, err))
    client.once('end', () => this.lost(client))
    try {
      await client.connect()
      await client.query(`LISTEN ${USERS_CHANGED_CHANNEL}`)
      if (this.stopped) return void (await client.end().catch(() => {}))
      this.client = client
    } catch (err) {
      this.lost(client, err)
    }
  }

  /** The user of a token: kept, or read with `load` (and kept when nothing changed meanwhile). */
  async get(userId: string, organizationId: string, load: () => Promise<AuthUser | null>): Promise<AuthUser | null> {
    const kept = this.client ? this.users.get(userId) : undefined
    if (kept) return kept.organizationId === organizationId ? kept : null
    const generation = this.generation
    const user = await load()
    if (user && this.client && generation === this.generation) this.users.set(userId, user)
    return user
  }

  /** Drops a user now; this process's own changes call it at once, other processes hear of them by notification. */
  forget(userId: string): void {
    this.generation++
    this.users.delete(userId)
  }

  private lost(client: pg.Client, err?: unknown): void {
    client.removeAllListeners('notification')
    if (this.client !== null && this.client !== client) return
    this.client = null
    this.generation++
    this.users.clear()
    if (err) this.onError(err)
    void client.end().catch(() => {})
    if (!this.stopped && !this.relisten) {
      this.relisten = setTimeout(() => {
        this.relisten = undefined
        void this.start()
      }, RELISTEN_MS)
    }
  }

  /** Whether users are being kept (the listening connection is up). */
  get listening(): boolean {
    return this.client !== null
  }

  async stop(): Promise<void> {
    this.stopped = true
    clearTimeout(this.relisten)
    const client = this.client
    this.client = null
    this.users.clear()
    await client?.end().catch(() => {})
  }
}
