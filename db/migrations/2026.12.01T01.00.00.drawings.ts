// The drawing register: sheets, their revisions (stored by SHA-256, processed in the background), and
// transmittals (what was issued, to whom, and when each recipient looked).
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

export async function up({ context: qi }: Ctx) {
  await qi.createTable("drawings", {
    id,
    project_id: ref("projects"),
    sheet_number: { type: DataTypes.TEXT, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    discipline: { type: DataTypes.TEXT, allowNull: false },
    scale_text: DataTypes.TEXT,
    created_by_id: ref("users", "RESTRICT"),
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("drawings", { type: "unique", fields: ["project_id", "sheet_number"], name: "drawings_sheet_per_project" });

  await qi.createTable("drawing_revisions", {
    id,
    project_id: ref("projects"),
    drawing_id: ref("drawings"),
    label: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    object_key: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    byte_size: { type: DataTypes.BIGINT, allowNull: false },
    original_filename: DataTypes.TEXT,
    source_page: DataTypes.INTEGER,
    page_count: { type: DataTypes.INTEGER, allowNull: false },
    pages: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    text: DataTypes.JSONB,
    processing: { type: DataTypes.TEXT, allowNull: false, defaultValue: "queued" },
    processing_error: DataTypes.TEXT,
    processed_pages: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    uploaded_by_id: ref("users", "RESTRICT"),
    issued_by_id: ref("users", "RESTRICT", true),
    issued_at: DataTypes.DATE,
    supersedes_id: ref("drawing_revisions", "SET NULL", true),
    superseded_by_id: ref("drawing_revisions", "SET NULL", true),
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("drawing_revisions", { type: "unique", fields: ["drawing_id", "label"], name: "drawing_revisions_label" });
  // The same bytes are one revision per project: a second upload is recognised, never stored twice.
  await qi.addConstraint("drawing_revisions", { type: "unique", fields: ["project_id", "sha256"], name: "drawing_revisions_bytes" });
  await qi.addIndex("drawing_revisions", ["drawing_id", "created_at"]);
  await qi.sequelize.query(`
    ALTER TABLE drawing_revisions ADD CONSTRAINT drawing_revisions_status
      CHECK (status IN ('draft','for_review','accepted','superseded','withdrawn'));
    ALTER TABLE drawing_revisions ADD CONSTRAINT drawing_revisions_processing
      CHECK (processing IN ('queued','running','done','failed'));
    CREATE UNIQUE INDEX drawing_revisions_one_accepted ON drawing_revisions (drawing_id) WHERE status = 'accepted';
  `);

  await qi.createTable("transmittals", {
    id,
    project_id: ref("projects"),
    number: { type: DataTypes.INTEGER, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    issued_status: { type: DataTypes.TEXT, allowNull: false },
    issued_by_id: ref("users", "RESTRICT"),
    created_at: at,
  });
  await qi.addConstraint("transmittals", { type: "unique", fields: ["project_id", "number"], name: "transmittals_number" });

  await qi.createTable("transmittal_items", {
    id,
    transmittal_id: ref("transmittals"),
    revision_id: ref("drawing_revisions", "RESTRICT"),
    created_at: at,
  });
  await qi.addConstraint("transmittal_items", { type: "unique", fields: ["transmittal_id", "revision_id"], name: "transmittal_items_pair" });

  await qi.createTable("transmittal_recipients", {
    id,
    transmittal_id: ref("transmittals"),
    user_id: ref("users", "RESTRICT"),
    mailed_at: DataTypes.DATE,
    seen_at: DataTypes.DATE,
    created_at: at,
  });
  await qi.addConstraint("transmittal_recipients", { type: "unique", fields: ["transmittal_id", "user_id"], name: "transmittal_recipients_pair" });
  await qi.addIndex("transmittal_recipients", ["user_id"]);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("transmittal_recipients");
  await qi.dropTable("transmittal_items");
  await qi.dropTable("transmittals");
  await qi.dropTable("drawing_revisions");
  await qi.dropTable("drawings");
}
