// Signed approvals: numbered per request, immutable once written except for their state (a trigger enforces it),
// and installation records by the site.
import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationParams } from "umzug";

type Ctx = MigrationParams<QueryInterface>;
const id = { type: DataTypes.UUID, primaryKey: true, allowNull: false, defaultValue: DataTypes.UUIDV4 };
const at = { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW };
const ref = (model: string, allowNull = false, onDelete = "RESTRICT") => ({ type: DataTypes.UUID, allowNull, references: { model, key: "id" }, onDelete });

export async function up({ context: qi }: Ctx) {
  await qi.createTable("approvals", {
    id,
    project_id: ref("projects"),
    request_id: ref("deviation_requests"),
    decision_id: ref("decisions"),
    n: { type: DataTypes.INTEGER, allowNull: false },
    reference: { type: DataTypes.TEXT, allowNull: false },
    outcome: { type: DataTypes.TEXT, allowNull: false },
    snapshot: { type: DataTypes.JSONB, allowNull: false },
    snapshot_sha256: { type: DataTypes.TEXT, allowNull: false },
    pack_key: { type: DataTypes.TEXT, allowNull: false },
    pack_sha256: { type: DataTypes.TEXT, allowNull: false },
    pack_bytes: { type: DataTypes.INTEGER, allowNull: false },
    rests_on: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false },
    signer_id: ref("users"),
    signing_key_id: ref("signing_keys"),
    certificate_sha256: { type: DataTypes.TEXT, allowNull: false },
    signed_at: { type: DataTypes.DATE, allowNull: false },
    verify_code: { type: DataTypes.TEXT, allowNull: false, unique: true },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: "current" },
    state_reason: DataTypes.TEXT,
    state_changed_at: DataTypes.DATE,
    created_at: at,
  });
  await qi.addConstraint("approvals", { type: "unique", fields: ["request_id", "n"], name: "approvals_request_version" });
  await qi.addIndex("approvals", ["project_id", "state"]);
  await qi.addIndex("approvals", ["pack_sha256"]);
  await qi.sequelize.query(`
    ALTER TABLE approvals ADD CONSTRAINT approvals_state CHECK (state IN ('current','needs_reapproval','superseded','withdrawn'));
    CREATE FUNCTION approvals_only_state_changes() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'DELETE' THEN
        RAISE EXCEPTION 'approvals are never deleted' USING ERRCODE = 'insufficient_privilege';
      END IF;
      IF (to_jsonb(NEW) - 'state' - 'state_reason' - 'state_changed_at') <> (to_jsonb(OLD) - 'state' - 'state_reason' - 'state_changed_at') THEN
        RAISE EXCEPTION 'a signed approval cannot be edited; only its state may change' USING ERRCODE = 'insufficient_privilege';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER approvals_immutable BEFORE UPDATE OR DELETE ON approvals
      FOR EACH ROW EXECUTE FUNCTION approvals_only_state_changes();
  `);

  await qi.createTable("installation_records", {
    id,
    project_id: ref("projects"),
    approval_id: ref("approvals"),
    recorded_by_id: ref("users"),
    installed_on: { type: DataTypes.DATEONLY, allowNull: false },
    note: DataTypes.TEXT,
    photo_keys: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    created_at: at,
  });
  await qi.addIndex("installation_records", ["approval_id"]);
  // A request closes when the site records it installed as approved.
  await qi.sequelize.query(`
    ALTER TABLE deviation_requests DROP CONSTRAINT deviation_requests_state;
    ALTER TABLE deviation_requests ADD CONSTRAINT deviation_requests_state
      CHECK (state IN ('draft','submitted','in_review','info_requested','resubmitted','decided','withdrawn','superseded','closed'));
  `);
}

export async function down({ context: qi }: Ctx) {
  await qi.sequelize.query(`
    UPDATE deviation_requests SET state = 'decided' WHERE state = 'closed';
    ALTER TABLE deviation_requests DROP CONSTRAINT deviation_requests_state;
    ALTER TABLE deviation_requests ADD CONSTRAINT deviation_requests_state
      CHECK (state IN ('draft','submitted','in_review','info_requested','resubmitted','decided','withdrawn','superseded'));
  `);
  await qi.dropTable("installation_records");
  await qi.dropTable("approvals");
  await qi.sequelize.query(`DROP FUNCTION IF EXISTS approvals_only_state_changes()`);
}
