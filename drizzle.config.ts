/**
 * drizzle-kit configuration. `npm run db:generate` writes SQL migrations from db/schema.ts
 * into db/migrations (commit them). `npm run db:studio` browses the database: a PostgreSQL
 * server when DATABASE_URL is set, else the embedded PGlite folder under EDGEFIELD_DATA_DIR.
 * Never point drizzle-kit at the data folder of a running app (PGlite has no cross-process lock).
 */
import path from 'node:path';
import { defineConfig } from 'drizzle-kit';

const dataDir = process.env.EDGEFIELD_DATA_DIR || './data';

export default process.env.DATABASE_URL
  ? defineConfig({
      dialect: 'postgresql',
      schema: './db/schema.ts',
      out: './db/migrations',
      dbCredentials: { url: process.env.DATABASE_URL },
    })
  : defineConfig({
      dialect: 'postgresql',
      driver: 'pglite',
      schema: './db/schema.ts',
      out: './db/migrations',
      dbCredentials: { url: path.join(dataDir, 'pglite') },
    });
