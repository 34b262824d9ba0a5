// Applies the committed SQL migrations in drizzle/ to the database named by NUXT_DB_* variables.
import mysql from 'mysql2/promise'
import { drizzle } from 'drizzle-orm/mysql2'
import { migrate } from 'drizzle-orm/mysql2/migrator'

const connection = await mysql.createConnection({
  host: process.env.NUXT_DB_HOST || '127.0.0.1',
  port: Number(process.env.NUXT_DB_PORT || 3417),
  user: process.env.NUXT_DB_USER || 'jogwise',
  password: process.env.NUXT_DB_PASSWORD || 'jogwise-local',
  database: process.env.NUXT_DB_NAME || 'jogwise',
  multipleStatements: true,
})
try {
  await migrate(drizzle(connection), { migrationsFolder: new URL('../drizzle', import.meta.url).pathname })
  console.log('[jogwise] migrations applied')
}
finally {
  await connection.end()
}
