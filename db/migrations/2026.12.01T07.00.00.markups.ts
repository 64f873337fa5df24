// The engineer's markups on a sheet revision for one request: a shape in PDF points (kind, points, text, colour,
// line weight), a version for optimistic concurrency, soft deletion so a removed markup stays on the record.
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;

const at = { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW };
const ref = (table: string, onDelete: "CASCADE" | "RESTRICT" = "CASCADE") => ({
  type: DataTypes.UUID,
  allowNull: false,
  references: { model: table, key: "id" },
  onDelete,
});

export async function up({ context: qi }: Ctx) {
  await qi.createTable("markups", {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 },
    project_id: ref("projects"),
    request_id: ref("deviation_requests"),
    revision_id: ref("drawing_revisions", "RESTRICT"),
    page: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    shape: { type: DataTypes.JSONB, allowNull: false },
    author_id: ref("users", "RESTRICT"),
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    deleted_at: DataTypes.DATE,
    created_at: at,
    updated_at: at,
  });
  await qi.addIndex("markups", ["request_id", "revision_id", "page"]);
  await qi.addIndex("markups", ["revision_id", "page"]);
  await qi.sequelize.query(`ALTER TABLE markups ADD CONSTRAINT markups_page CHECK (page >= 1)`);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("markups");
}
