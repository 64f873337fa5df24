// The one migration runner, used by `npm start`, `npm test` and CI alike.
import path from "node:path";
import { fileURLToPath } from "node:url";
import { SequelizeStorage, Umzug } from "umzug";
import type { Sequelize } from "sequelize";

const here = path.dirname(fileURLToPath(import.meta.url));

export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: { glob: ["migrations/*.ts", { cwd: here }] },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}
