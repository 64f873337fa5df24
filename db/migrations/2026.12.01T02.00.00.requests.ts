// Deviation requests and their review: requests (numbered per project), content versions, pins on sheets,
// attachments in object storage, the comment thread, per-member mutes, and the engineer's decisions with an
// assessment per principle.
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;

const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 };
const at = { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW };
const ref = (table: string, onDelete: "CASCADE" | "SET NULL" | "RESTRICT" = "CASCADE", allowNull = false) => ({
  type: DataTypes.UUID,
  allowNull,
  references: { model: table, key: "id" },
  onDelete,
});
const text = (defaultValue = "") => ({ type: DataTypes.TEXT, allowNull: false, defaultValue });

export async function up({ context: qi }: Ctx) {
  await qi.createTable("deviation_requests", {
    id,
    project_id: ref("projects"),
    number: { type: DataTypes.INTEGER, allowNull: false },
    // Mirrors of the current version, for lists and filters.
    title: { type: DataTypes.TEXT, allowNull: false },
    provision: { type: DataTypes.TEXT, allowNull: false },
    clause_ref: text(),
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "draft" },
    assignee_id: ref("users", "SET NULL", true),
    due_at: DataTypes.DATE,
    submitted_at: DataTypes.DATE,
    state_changed_at: at,
    created_by_id: ref("users", "RESTRICT"),
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("deviation_requests", { type: "unique", fields: ["project_id", "number"], name: "deviation_requests_number" });
  await qi.addIndex("deviation_requests", ["assignee_id", "state"]);
  await qi.addIndex("deviation_requests", ["created_by_id"]);
  await qi.sequelize.query(`
    ALTER TABLE deviation_requests ADD CONSTRAINT deviation_requests_state
      CHECK (state IN ('draft','submitted','in_review','info_requested','resubmitted','decided','withdrawn','superseded'));
  `);

  await qi.createTable("request_versions", {
    id,
    request_id: ref("deviation_requests"),
    n: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    provision: { type: DataTypes.TEXT, allowNull: false },
    clause_ref: text(),
    site_constraint: text(),
    proposal: text(),
    measurements: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    created_by_id: ref("users", "RESTRICT"),
    // Set when the version is sent to the engineer; from then on it never changes.
    submitted_at: DataTypes.DATE,
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("request_versions", { type: "unique", fields: ["request_id", "n"], name: "request_versions_n" });

  await qi.createTable("request_pins", {
    id,
    request_id: ref("deviation_requests"),
    revision_id: ref("drawing_revisions", "RESTRICT"),
    page: { type: DataTypes.INTEGER, allowNull: false },
    x_pt: { type: DataTypes.DOUBLE, allowNull: false },
    y_pt: { type: DataTypes.DOUBLE, allowNull: false },
    n: { type: DataTypes.INTEGER, allowNull: false },
    created_by_id: ref("users", "RESTRICT"),
    created_at: at,
  });
  await qi.addConstraint("request_pins", { type: "unique", fields: ["request_id", "n"], name: "request_pins_n" });

  await qi.createTable("comments", {
    id,
    request_id: ref("deviation_requests"),
    author_id: ref("users", "RESTRICT"),
    body: { type: DataTypes.TEXT, allowNull: false },
    mentions: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    // The markup a comment quotes (markups arrive with the review canvas).
    quoted_markup_id: { type: DataTypes.UUID, allowNull: true },
    created_at: at,
  });
  await qi.addIndex("comments", ["request_id", "created_at"]);

  await qi.createTable("attachments", {
    id,
    project_id: ref("projects"),
    request_id: ref("deviation_requests"),
    // The content version it was added to (null for a comment's attachment).
    version_n: DataTypes.INTEGER,
    comment_id: ref("comments", "SET NULL", true),
    object_key: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    content_type: { type: DataTypes.TEXT, allowNull: false },
    byte_size: { type: DataTypes.BIGINT, allowNull: false },
    filename: { type: DataTypes.TEXT, allowNull: false },
    thumb_key: DataTypes.TEXT,
    width_px: DataTypes.INTEGER,
    height_px: DataTypes.INTEGER,
    uploaded_by_id: ref("users", "RESTRICT"),
    created_at: at,
  });
  await qi.addIndex("attachments", ["request_id"]);
  await qi.addIndex("attachments", ["project_id", "sha256"]);

  await qi.createTable("project_mutes", {
    id,
    project_id: ref("projects"),
    user_id: ref("users"),
    created_at: at,
  });
  await qi.addConstraint("project_mutes", { type: "unique", fields: ["project_id", "user_id"], name: "project_mutes_pair" });

  await qi.createTable("decisions", {
    id,
    request_id: ref("deviation_requests"),
    request_version_id: ref("request_versions", "RESTRICT"),
    // Null while the engineer is still working on it; set when recorded.
    outcome: DataTypes.TEXT,
    conditions: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    reasons: text(),
    rests_on: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    decided_by_id: ref("users", "RESTRICT"),
    recorded_at: DataTypes.DATE,
    created_at: at,
    updated_at: at,
  });
  await qi.sequelize.query(`
    ALTER TABLE decisions ADD CONSTRAINT decisions_outcome
      CHECK (outcome IS NULL OR outcome IN ('approved','approved_with_conditions','refused'));
    CREATE UNIQUE INDEX decisions_one_per_version ON decisions (request_version_id);
    CREATE INDEX decisions_rests_on ON decisions USING gin (rests_on);
  `);

  await qi.createTable("assessments", {
    id,
    decision_id: ref("decisions"),
    principle: { type: DataTypes.TEXT, allowNull: false },
    outcome: DataTypes.TEXT,
    reasoning: text(),
    evidence: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("assessments", { type: "unique", fields: ["decision_id", "principle"], name: "assessments_principle" });
  await qi.sequelize.query(`
    ALTER TABLE assessments ADD CONSTRAINT assessments_outcome
      CHECK (outcome IS NULL OR outcome IN ('not_affected','maintained','compromised'));
  `);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("assessments");
  await qi.dropTable("decisions");
  await qi.dropTable("project_mutes");
  await qi.dropTable("attachments");
  await qi.dropTable("comments");
  await qi.dropTable("request_pins");
  await qi.dropTable("request_versions");
  await qi.dropTable("deviation_requests");
}
