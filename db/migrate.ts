// CLI: `tsx db/migrate.ts up|down [--to 0]`. Reads DATABASE_URL like the app does.
import { sequelize } from "./connection";
import { createMigrator, migrateUp } from "./migrator";

const [command = "up", ...rest] = process.argv.slice(2);
const migrator = createMigrator(sequelize);
try {
  if (command === "up") {
    await migrateUp(sequelize);
  } else if (command === "down") {
    const to = rest[0] === "--to" ? (rest[1] === "0" ? 0 : rest[1]) : undefined;
    const done = await migrator.down(to === undefined ? undefined : { to: to as 0 });
    console.log(`migrations reverted: ${done.map((m) => m.name).join(", ") || "none"}`);
  } else {
    throw new Error(`unknown command ${command}; use up or down`);
  }
} finally {
  await sequelize.close();
}
