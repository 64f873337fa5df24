// Engineer verification records and signing identities (certificate + private key encrypted at rest).
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;
const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 };
const at = { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW };

export async function up({ context: qi }: Ctx) {
  await qi.createTable("registration_verifications", {
    id,
    user_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
    project_id: { type: DataTypes.UUID, allowNull: false, references: { model: "projects", key: "id" }, onDelete: "CASCADE" },
    verified_by_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    outcome: { type: DataTypes.TEXT, allowNull: false },
    registration_number: { type: DataTypes.TEXT, allowNull: false },
    registration_body: { type: DataTypes.TEXT, allowNull: false },
    checked_on: { type: DataTypes.DATEONLY, allowNull: false },
    note: DataTypes.TEXT,
    evidence_key: DataTypes.TEXT,
    evidence_name: DataTypes.TEXT,
    evidence_sha256: DataTypes.TEXT,
    created_at: at,
  });
  await qi.addIndex("registration_verifications", ["user_id", "created_at"]);
  await qi.sequelize.query(
    `ALTER TABLE registration_verifications ADD CONSTRAINT registration_verifications_outcome CHECK (outcome IN ('verified','revoked'))`,
  );
  await qi.createTable("signing_keys", {
    id,
    user_id: { type: DataTypes.UUID, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
    certificate_pem: { type: DataTypes.TEXT, allowNull: false },
    certificate_sha256: { type: DataTypes.TEXT, allowNull: false, unique: true },
    encrypted_private_key: { type: DataTypes.TEXT, allowNull: false },
    registration_number: { type: DataTypes.TEXT, allowNull: false },
    revoked_at: DataTypes.DATE,
    created_at: at,
  });
  // At most one usable key per engineer.
  await qi.sequelize.query(`CREATE UNIQUE INDEX signing_keys_one_active ON signing_keys (user_id) WHERE revoked_at IS NULL`);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("signing_keys");
  await qi.dropTable("registration_verifications");
}
