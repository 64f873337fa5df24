// Saved calculations: one row per calculation a project keeps, with the inputs as validated, the outputs the
// server recomputed with the engine, and the engine version that produced them. request_id will link a
// calculation to a deviation request later (no foreign key yet).
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx) {
  await qi.createTable("calculations", {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 },
    project_id: { type: DataTypes.UUID, allowNull: false, references: { model: "projects", key: "id" }, onDelete: "CASCADE" },
    kind: { type: DataTypes.TEXT, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    inputs: { type: DataTypes.JSONB, allowNull: false },
    outputs: { type: DataTypes.JSONB, allowNull: false },
    engine_version: { type: DataTypes.TEXT, allowNull: false },
    created_by: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    request_id: { type: DataTypes.UUID, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addIndex("calculations", ["project_id", "kind", "created_at"]);
  await qi.addIndex("calculations", ["request_id"]);
  await qi.sequelize.query(`
    ALTER TABLE calculations ADD CONSTRAINT calculations_kind
      CHECK (kind IN ('balance','segment','discharge','vacuum','valves','storage','deadleg'));
  `);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("calculations");
}
