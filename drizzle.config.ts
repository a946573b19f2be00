import { defineConfig } from 'drizzle-kit';

// drizzle-kit generates SQL migrations from src/lib/db/schema.ts into drizzle/ (committed).
export default defineConfig({
  dialect: 'sqlite',
  schema: './src/lib/db/schema.ts',
  out: './drizzle',
  dbCredentials: { url: process.env.DATABASE_URL ?? 'file:./data/varledger.db' },
});
