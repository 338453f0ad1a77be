import { createHash } from 'node:crypto'
import type { Pool, PoolClient, QueryResultRow } from 'pg'
import type { EntityManager } from 'typeorm'
import type { PostgresDriver } from 'typeorm/driver/postgres/PostgresDriver.js'

/** Statement names by SQL text; the hot reads have a bounded set of texts (filters × sorts). */
const statementNames = new Map<string, string>()

function statementName(text: string): string {
  let name = statementNames.get(text)
  if (!name) {
    name = `stringline_${createHash('sha256').update(text).digest('hex').slice(0, 24)}`
    statementNames.set(text, name)
  }
  return name
}

/**
 * Runs SQL as a named prepared statement on the connection `manager` works on (its transaction's,
 * or one from the pool): PostgreSQL parses it once per connection instead of on every request,
 * which was as much CPU as the API process itself spent on the most read routes. For hot reads only:
 * it goes past TypeORM's query logging.
 */
export async function preparedQuery<R extends QueryResultRow>(manager: EntityManager, text: string, values: unknown[]): Promise<R[]> {
  const statement = { name: statementName(text), text, values }
  const runner = manager.queryRunner
  if (runner && !runner.isReleased) {
    const client = (await runner.connect()) as PoolClient
    return (await client.query<R>(statement)).rows
  }
  const pool = (manager.connection.driver as PostgresDriver).master as Pool
  return (await pool.query<R>(statement)).rows
}
