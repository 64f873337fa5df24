// Migrations run down to nothing and up again on a scratch database, with the same runner start and CI use.
import { afterAll, describe, expect, it } from "vitest";
import pg from "pg";
import { Sequelize } from "sequelize";
import { createMigrator } from "../../db/migrator";

const base = new URL(process.env.DATABASE_URL!);
const scratchName = `${base.pathname.slice(1)}_migrations`;

async function admin(sql: string) {
  const url = new URL(base);
  url.pathname = "/postgres";
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try { await client.query(sql); } finally { await client.end(); }
}

describe("migrations", () => {
  let sequelize: Sequelize;
  afterAll(async () => {
    await sequelize?.close();
    await admin(`DROP DATABASE IF EXISTS "${scratchName}" WITH (FORCE)`);
  });

  it("go up, all the way down, and up again", async () => {
    await admin(`DROP DATABASE IF EXISTS "${scratchName}" WITH (FORCE)`);
    await admin(`CREATE DATABASE "${scratchName}"`);
    const url = new URL(base);
    url.pathname = `/${scratchName}`;
    sequelize = new Sequelize(url.toString(), { dialect: "postgres", dialectModule: pg, logging: false });
    const migrator = createMigrator(sequelize);
    const all = await migrator.pending();
    expect(all.length).toBeGreaterThan(0);
    await migrator.up();
    const tables = async () => (await sequelize.getQueryInterface().showAllTables()).filter((t) => t !== "schema_migrations").sort();
    expect(await tables()).toEqual(expect.arrayContaining(["users", "sessions", "projects", "project_members", "invitations", "password_resets", "audit_events"]));
    await migrator.down({ to: 0 });
    expect(await tables()).toEqual([]);
    await migrator.up();
    expect((await migrator.executed()).length).toBe(all.length);
  });

  it("keeps the audit log append-only in the database itself", async () => {
    await sequelize.query(`INSERT INTO audit_events (id, action, data, created_at) VALUES (gen_random_uuid(), 'test.event', '{}', now())`);
    await expect(sequelize.query(`UPDATE audit_events SET action = 'changed'`)).rejects.toThrow(/append-only/);
    await expect(sequelize.query(`DELETE FROM audit_events`)).rejects.toThrow(/append-only/);
  });
});
