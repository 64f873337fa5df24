// Prints the demo sign-ins for `npm start`.
import { ROLE_LABELS } from "../app/projects/permissions";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "./demo";

console.log(`  Demo sign-ins (password for all: ${DEMO_PASSWORD}):`);
for (const p of DEMO_PEOPLE) console.log(`    ${ROLE_LABELS[p.role].padEnd(17)}${p.email}`);
