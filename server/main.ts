import { ConfigError, loadConfig } from './config'
import { runServer } from './server'

/**
 * Entry point for a deployed API process: DATABASE_URL names the server, migrations run at start.
 * The local launcher (`npm start`, scripts/start.ts) starts its own cluster first.
 */
async function main() {
  const databaseUrl = process.env.DATABASE_URL
  if (!databaseUrl) throw new ConfigError('DATABASE_URL must be set')
  const running = await runServer(loadConfig(), databaseUrl, { demo: process.env.LOAD_DEMO_DATA === 'true' })
  const stop = () => void running.close().then(() => process.exit(0))
  process.once('SIGINT', stop)
  process.once('SIGTERM', stop)
}

main().catch((err: unknown) => {
  console.error(err instanceof ConfigError ? `Configuration error: ${err.message}` : err)
  process.exit(1)
})
