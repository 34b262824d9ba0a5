import { defineConfig } from 'drizzle-kit'

// Generates SQL migrations from server/database/schema.ts into drizzle/ (committed).
// `npm run db:generate` needs no database; migrations are applied by scripts/migrate.ts.
export default defineConfig({
  dialect: 'mysql',
  schema: './server/database/schema.ts',
  out: './drizzle',
})
