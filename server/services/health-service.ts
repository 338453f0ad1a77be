import cluster from 'node:cluster'
import type { DataSource } from 'typeorm'
import { isApiProcessCount, type ApiProcessCount } from '../api-processes'

const PING_TIMEOUT_MS = 1500

/** Asks PostgreSQL for `SELECT 1`, giving up quickly so a health probe never hangs; knows how many API processes listen. */
export class HealthService {
  private processCount: ApiProcessCount | null = null

  constructor(private readonly db: DataSource) {
    // in a cluster's API process, the primary says how many of its API processes listen
    if (cluster.isWorker) process.on('message', (message: unknown) => {
      if (isApiProcessCount(message)) this.processCount = { listening: message.listening, configured: message.configured }
    })
  }

  /** How many of this machine's API processes listen, or null when the API runs as one process. */
  apiProcesses(): ApiProcessCount | null {
    return this.processCount
  }

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
