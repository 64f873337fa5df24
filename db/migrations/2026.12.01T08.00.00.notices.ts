// Non-compliance notices: what a plumber found wrong on an existing installation, reported to the owner in writing.
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx) {
  await qi.createTable("noncompliance_notices", {
    id: { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 },
    project_id: { type: DataTypes.UUID, allowNull: false, references: { model: "projects", key: "id" }, onDelete: "CASCADE" },
    number: { type: DataTypes.INTEGER, allowNull: false },
    created_by_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    owner_name: { type: DataTypes.TEXT, allowNull: false },
    owner_email: { type: DataTypes.TEXT, allowNull: false },
    property: { type: DataTypes.TEXT, allowNull: false },
    inspected_on: { type: DataTypes.DATEONLY, allowNull: false },
    items: { type: DataTypes.JSONB, allowNull: false },
    pdf_key: { type: DataTypes.TEXT, allowNull: false },
    pdf_sha256: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await qi.addConstraint("noncompliance_notices", { type: "unique", fields: ["project_id", "number"], name: "noncompliance_notices_number" });
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("noncompliance_notices");
}
