// Accounts, sessions, projects, members, invitations, resets, sign-in attempts and the insert-only audit log.
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
  await qi.sequelize.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
  await qi.createTable("users", {
    id,
    email: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    phone: DataTypes.TEXT,
    profession: DataTypes.TEXT,
    password_hash: { type: DataTypes.TEXT, allowNull: false },
    registration_number: DataTypes.TEXT,
    registration_body: DataTypes.TEXT,
    registration_state: DataTypes.TEXT,
    verified_by_id: ref("users", "SET NULL", true),
    verified_at: DataTypes.DATE,
    created_at: at,
    updated_at: at,
  });
  await qi.sequelize.query(`CREATE UNIQUE INDEX users_email_lower ON users (lower(email))`);
  await qi.sequelize.query(
    `ALTER TABLE users ADD CONSTRAINT users_registration_state CHECK (registration_state IS NULL OR registration_state IN ('unverified','verified','revoked'))`,
  );

  await qi.createTable("sessions", {
    id,
    id_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    user_id: ref("users", "CASCADE", true),
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    user_agent: DataTypes.TEXT,
    ip: DataTypes.TEXT,
    created_at: at,
    updated_at: at,
  });
  await qi.addIndex("sessions", ["user_id"]);
  await qi.addIndex("sessions", ["expires_at"]);

  await qi.createTable("password_resets", {
    id,
    user_id: ref("users"),
    token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: DataTypes.DATE,
    created_at: at,
  });

  await qi.createTable("sign_in_attempts", {
    id,
    email: { type: DataTypes.TEXT, allowNull: false },
    ip: DataTypes.TEXT,
    succeeded: { type: DataTypes.BOOLEAN, allowNull: false },
    created_at: at,
  });
  await qi.addIndex("sign_in_attempts", ["email", "created_at"]);
  await qi.addIndex("sign_in_attempts", ["ip", "created_at"]);

  await qi.createTable("projects", {
    id,
    name: { type: DataTypes.TEXT, allowNull: false },
    site_address: { type: DataTypes.TEXT, allowNull: false },
    client_name: DataTypes.TEXT,
    description: DataTypes.TEXT,
    created_by_id: ref("users", "RESTRICT"),
    created_at: at,
    updated_at: at,
  });

  await qi.createTable("project_members", {
    id,
    project_id: ref("projects"),
    user_id: ref("users"),
    role: { type: DataTypes.TEXT, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: at,
    updated_at: at,
  });
  await qi.addConstraint("project_members", { type: "unique", fields: ["project_id", "user_id"], name: "project_members_pair" });
  await qi.addIndex("project_members", ["user_id"]);
  await qi.sequelize.query(
    `ALTER TABLE project_members ADD CONSTRAINT project_members_role CHECK (role IN ('site_plumber','engineer','architect','manager'))`,
  );

  await qi.createTable("invitations", {
    id,
    project_id: ref("projects"),
    email: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    token_hash: { type: DataTypes.TEXT, allowNull: false, unique: true },
    invited_by_id: ref("users", "RESTRICT"),
    expires_at: { type: DataTypes.DATE, allowNull: false },
    accepted_at: DataTypes.DATE,
    accepted_by_id: ref("users", "SET NULL", true),
    revoked_at: DataTypes.DATE,
    created_at: at,
    updated_at: at,
  });
  await qi.addIndex("invitations", ["project_id"]);

  await qi.createTable("audit_events", {
    id,
    project_id: ref("projects", "RESTRICT", true),
    actor_id: ref("users", "RESTRICT", true),
    action: { type: DataTypes.TEXT, allowNull: false },
    subject_type: DataTypes.TEXT,
    subject_id: DataTypes.UUID,
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    created_at: at,
  });
  await qi.addIndex("audit_events", ["project_id", "created_at"]);
  await qi.sequelize.query(`
    CREATE FUNCTION audit_events_insert_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit_events is append-only (% refused)', TG_OP USING ERRCODE = 'insufficient_privilege';
    END $$;
    CREATE TRIGGER audit_events_no_change BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_insert_only();
    CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events
      FOR EACH STATEMENT EXECUTE FUNCTION audit_events_insert_only();
  `);
}

export async function down({ context: qi }: Ctx) {
  await qi.dropTable("audit_events");
  await qi.sequelize.query(`DROP FUNCTION IF EXISTS audit_events_insert_only()`);
  await qi.dropTable("invitations");
  await qi.dropTable("project_members");
  await qi.dropTable("projects");
  await qi.dropTable("sign_in_attempts");
  await qi.dropTable("password_resets");
  await qi.dropTable("sessions");
  await qi.dropTable("users");
}
