// Zod in the browser parses without compiling. Zod compiles fast object parsers with `new Function`, and decides
// whether it may when each object schema is built, by trying `new Function("")`; our CSP forbids eval, so that
// probe is reported as a policy violation on every page that builds a schema. This module is imported first by
// the root route, so it runs before any schema module. The server has no CSP and keeps the compiled parsers.
import { z } from "zod";

if (typeof document !== "undefined") z.config({ jitless: true });
