// The one Sequelize handle. Models register on it in db/models; the migration runner uses its query interface.
import pg from "pg";
import { Sequelize } from "sequelize";
import { env } from "../app/platform/env.server";

export const sequelize = new Sequelize(env.DATABASE_URL, {
  dialect: "postgres",
  dialectModule: pg,
  logging: false,
  pool: { max: env.DATABASE_POOL_MAX, min: 0, idle: 10_000, acquire: 5_000 },
  dialectOptions: { connectionTimeoutMillis: 3_000 },
  define: { underscored: true },
});

const UNAVAILABLE = new Set([
  "SequelizeConnectionError",
  "SequelizeConnectionRefusedError",
  "SequelizeConnectionAcquireTimeoutError",
  "SequelizeHostNotFoundError",
  "SequelizeHostNotReachableError",
  "SequelizeConnectionTimedOutError",
  "SequelizeAccessDeniedError",
]);

/** True when an error means the database cannot be reached (as opposed to a bad query). */
export function isDatabaseUnavailable(error: unknown): boolean {
  if (!(error instanceof Error)) return false;
  if (UNAVAILABLE.has(error.name)) return true;
  const code = (error as { parent?: { code?: string }; original?: { code?: string } }).parent?.code;
  return code === "ECONNREFUSED" || code === "57P01" || code === "57P03" || /terminat|ECONNRESET|Connection terminated/i.test(error.message);
}
