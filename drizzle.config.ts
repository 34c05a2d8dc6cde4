import { defineConfig } from 'drizzle-kit'

export default defineConfig({
  dialect: 'sqlite',
  schema: './server/db/schema.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.NUXT_DB_PATH || 'data/tidewright.sqlite' },
})
