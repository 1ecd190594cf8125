import { defineConfig } from "drizzle-kit";

// `npm run db:generate` writes SQL into db/migrations; it needs no database.
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema.ts",
  out: "./db/migrations",
});
