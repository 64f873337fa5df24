// Indexes that reads of a large project need: a request's decisions (review desk, sheet, signing) were found by
// scanning every decision, and the per-state counts of a project's request list by scanning every request.
import type { QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx) {
  await qi.addIndex("decisions", ["request_id", "created_at"], { name: "decisions_request_created" });
  await qi.addIndex("deviation_requests", ["project_id", "state"], { name: "deviation_requests_project_state" });
}

export async function down({ context: qi }: Ctx) {
  await qi.removeIndex("deviation_requests", "deviation_requests_project_state");
  await qi.removeIndex("decisions", "decisions_request_created");
}
