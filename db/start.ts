// What `npm start` needs from the database, in one process (each tsx start costs seconds on a small machine):
// migrations, the demo where it is missing, and the sign-in lines for the welcome message. `tsx db/start.ts FILE`
// writes those lines to FILE.
import { writeFileSync } from "node:fs";
import { ROLE_LABELS } from "../app/projects/permissions";
import { sequelize } from "./connection";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "./demo";
import { migrateUp } from "./migrator";
import { loadDemo } from "./seed";

try {
  await migrateUp(sequelize);
  await loadDemo();
} finally {
  await sequelize.close();
}

const lines = [`  Demo sign-ins (password for all: ${DEMO_PASSWORD}):`, ...DEMO_PEOPLE.map((p) => `    ${ROLE_LABELS[p.role].padEnd(17)}${p.email}`)];
if (process.argv[2]) writeFileSync(process.argv[2], `${lines.join("\n")}\n`);
else console.log(lines.join("\n"));
