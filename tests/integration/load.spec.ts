// The load run at tiny size, once, against the built app: the seeder makes a project that every loaded page and
// API read answers 2xx for, signed in, under concurrent load (no errors, no timings asserted), and the bare-SQL
// baseline runs beside it. Also the pages of the lists the load reads: requests and the register's API come a
// page at a time, in the same order across pages, with what needs the viewer's action first.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL } from "../support/env";
import { Client } from "../support/http";
import { loadSeeded, type LoadResults } from "../load/load";
import { seedLarge, type SeededProject } from "../load/seed-large";

let seeded: SeededProject;
let results: LoadResults;
const engineer = new Client();

beforeAll(async () => {
  seeded = await seedLarge("tiny");
  await engineer.signIn(seeded.users.engineer.email, seeded.password);
}, 60_000);

describe("load on a seeded project (tiny)", () => {
  it("seeds every kind of row the load reads", () => {
    expect(seeded.counts).toMatchObject({ drawings: 5, drawing_revisions: 10, deviation_requests: 20, markups: 200 });
    for (const n of Object.values(seeded.counts)) expect(n).toBeGreaterThan(0);
  });

  it("answers every request of the run with a 2xx, with no socket errors or timeouts", async () => {
    // Long enough that the slowest endpoint completes requests even on a busy 2-core machine.
    results = await loadSeeded(seeded, { baseUrl: APP_URL, connections: 5, durationSec: 4 });
    expect(results.endpoints).toHaveLength(9);
    for (const e of results.endpoints) {
      expect({ endpoint: e.name, errors: e.errors, non2xx: e.non2xx, timeouts: e.timeouts }).toEqual({ endpoint: e.name, errors: 0, non2xx: 0, timeouts: 0 });
      expect(e.requests).toBeGreaterThan(0);
      expect(e.bare?.runs).toBeGreaterThan(0);
    }
    expect(results.total.errors + results.total.non2xx + results.total.timeouts).toBe(0);
  }, 60_000);
});

describe("lists a page at a time", () => {
  const api = () => `/api/projects/${seeded.projectId}`;

  it("pages the requests in one order, what needs my action first, with counts over all of them", async () => {
    const all = await engineer.json(`${api()}/requests?limit=200`);
    expect(all.body.matching).toBe(all.body.total);
    const paged = [];
    for (let page = 1; page <= Math.ceil(all.body.matching / 6); page++) {
      const { status, body } = await engineer.json(`${api()}/requests?limit=6&page=${page}`);
      expect(status).toBe(200);
      expect(body.rows.length).toBeLessThanOrEqual(6);
      expect(body.counts).toEqual(all.body.counts);
      paged.push(...body.rows);
    }
    expect(paged.map((r) => r.id)).toEqual(all.body.rows.map((r: { id: string }) => r.id));
    const flags = paged.map((r) => r.needsMe);
    expect(flags.indexOf(false) === -1 || flags.lastIndexOf(true) < flags.indexOf(false)).toBe(true);
    expect(flags).toContain(true);
    const byDefault = await engineer.json(`${api()}/requests`);
    expect(byDefault.body.pageSize).toBe(50);
  });

  it("shows a pager on the requests page once there is more than a page", async () => {
    const res = await engineer.get(`/projects/${seeded.projectId}/requests?limit=5&page=2&state=`);
    const html = await res.text();
    expect(res.status).toBe(200);
    expect(html).toContain("Previous page");
    expect(html).toContain("Next page");
  });

  it("pages the register's API by sheet number with a cursor", async () => {
    const first = await engineer.json(`${api()}/drawings?limit=2`);
    expect(first.body.drawings.map((d: { sheetNumber: string }) => d.sheetNumber)).toEqual(["PL-0001", "PL-0002"]);
    expect(first.body.drawings[0].revisions).toHaveLength(2);
    const rest = await engineer.json(`${api()}/drawings?limit=10&after=${first.body.next}`);
    expect(rest.body.drawings.map((d: { sheetNumber: string }) => d.sheetNumber)).toEqual(["PL-0003", "PL-0004", "PL-0005"]);
    expect(rest.body.next).toBeNull();
  });
});

afterAll(() => {
  if (results) console.log(`load (tiny): ${results.total.requests} requests, p95 ${results.total.p95} ms, bare p95 ${results.total.bare?.p95} ms`);
});
