// Every migration, in order. Listed explicitly (not globbed) so the same runner works under tsx, vitest and a
// bundled server alike. Add new migrations at the end.
import * as foundation from "./2026.12.01T00.00.00.foundation";
import * as drawings from "./2026.12.01T01.00.00.drawings";
import * as requests from "./2026.12.01T02.00.00.requests";
import * as calculations from "./2026.12.01T03.00.00.calculations";
import * as signing from "./2026.12.01T05.00.00.signing";
import * as approvals from "./2026.12.01T06.00.00.approvals";
import * as notices from "./2026.12.01T08.00.00.notices";
import * as markups from "./2026.12.01T07.00.00.markups";
import * as indexes from "./2026.12.02T00.00.00.indexes";

export const MIGRATIONS = [
  { name: "2026.12.01T00.00.00.foundation", ...foundation },
  { name: "2026.12.01T01.00.00.drawings", ...drawings },
  { name: "2026.12.01T02.00.00.requests", ...requests },
  { name: "2026.12.01T03.00.00.calculations", ...calculations },
  { name: "2026.12.01T05.00.00.signing", ...signing },
  { name: "2026.12.01T06.00.00.approvals", ...approvals },
  { name: "2026.12.01T07.00.00.markups", ...markups },
  { name: "2026.12.01T08.00.00.notices", ...notices },
  { name: "2026.12.02T00.00.00.indexes", ...indexes },
];
