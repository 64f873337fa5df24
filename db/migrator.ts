// The one migration runner, used by `npm start`, `npm test` and CI alike.
import type { QueryInterface, Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";
import { MIGRATIONS } from "./migrations";

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: MIGRATIONS.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up({ context, name: m.name }),
      down: ({ context }) => m.down({ context, name: m.name }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}

/** Applies what is pending and says what it did (the line `npm start`, `npm test` and `npm run migrate` print). */
export async function migrateUp(sequelize: Sequelize) {
  const done = await createMigrator(sequelize).up();
  console.log(done.length ? `migrations applied: ${done.map((m) => m.name).join(", ")}` : "migrations: up to date");
}
