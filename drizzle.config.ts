import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  driver: 'pglite',
  schema: ['./server/db/schema.ts', './server/db/auth-schema.ts'],
  out: './drizzle',
  dbCredentials: { url: './data/drizzle-kit' },
});
