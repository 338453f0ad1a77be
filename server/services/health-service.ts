import type { DataSource } from 'typeorm'

const PING_TIMEOUT_MS = 1500

/** Asks PostgreSQL for `SELECT 1`, giving up quickly so a health probe never hangs. */
export class HealthService {
  constructor(private readonly db: DataSource) {}

  async databaseUp(): Promise<boolean> {
    let timer: NodeJS.Timeout | undefined
    const timeout = new Promise<false>((resolve) => {
      timer = setTimeout(() => resolve(false), PING_TIMEOUT_MS)
    })
    const ping = this.db
      .query('SELECT 1')
      .then(() => true)
      .catch(() => false)
    try {
      return await Promise.race([ping, timeout])
    } finally {
      clearTimeout(timer)
    }
  }
}
