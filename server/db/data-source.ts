import { DataSource } from 'typeorm'
import { ENTITIES } from '../entities'
import { MIGRATIONS } from '../migrations'

/**
 * The TypeORM data source. Schema changes only ever come from migrations: `synchronize` stays off
 * everywhere, tests included (they run the same migrations on a throwaway database).
 */
export function createDataSource(databaseUrl: string): DataSource {
  return new DataSource({
    type: 'postgres',
    url: databaseUrl,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    // fail fast when PostgreSQL is down, so the API can answer 503 in time
    connectTimeoutMS: 2000,
    extra: { max: Number(process.env.DB_POOL_MAX ?? 10), connectionTimeoutMillis: 2000, query_timeout: 15_000 },
  })
}
