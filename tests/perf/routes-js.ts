// JavaScript per route, gzip: what a first visit to a page downloads, from a production build's browser manifest
// (build/client/assets/manifest-*.js, the object React Router hands the browser): the entry module and its
// imports, then for the route and each parent its module and imports, each file once, each gzipped at level 9 as
// a server would. Chunks a route may load later by dynamic import (pdf.js, the markup canvas) are summed apart,
// followed through every chunk they import in turn; the pdf.js worker is left out (a separate thread, cached
// once per visit, not part of the page's own script). A page that asks for no script (app/ui/plain-page.ts) is
// counted from the document the app serves instead, when APP_URL answers: the scripts that document names.
//   npx tsx tests/perf/routes-js.ts [build dir]   (COUNTERSIGN_BUILD_DIR or build by default)
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { writeBench } from "./bench-out";

export const ROUTES = {
  "sign-in": "routes/sign-in",
  review: "routes/projects.$projectId.requests.$requestId.review",
} as const;

/** Pages counted from what the running app serves to a visitor who is not signed in. */
export const SERVED_PATHS: Partial<Record<keyof typeof ROUTES, string>> = { "sign-in": "/sign-in" };

/** The script URLs a served document names: module preloads, script sources and the inline entry's imports. */
export function documentScripts(html: string): string[] {
  const urls = new Set<string>();
  for (const m of html.matchAll(/<link\b[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)) urls.add(m[1]!);
  for (const m of html.matchAll(/<script\b[^>]*src="([^"]+)"/g)) urls.add(m[1]!);
  for (const m of html.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)) {
    for (const i of m[1]!.matchAll(/(?:import\(?|from)\s*["']([^"']+\.m?js)["']/g)) urls.add(i[1]!);
  }
  return [...urls].map((u) => u.replace(/^\//, ""));
}

interface ManifestRoute {
  id: string;
  parentId?: string;
  module: string;
  imports?: string[];
}
interface Manifest {
  entry: { module: string; imports: string[] };
  routes: Record<string, ManifestRoute>;
}

export function readManifest(buildDir: string): Manifest {
  const assets = path.join(buildDir, "client", "assets");
  const file = readdirSync(assets).find((f) => /^manifest-.*\.js$/.test(f));
  if (!file) throw new Error(`no browser manifest in ${assets}; build first (npm run build)`);
  const text = readFileSync(path.join(assets, file), "utf8");
  return JSON.parse(text.slice(text.indexOf("=") + 1).replace(/;\s*$/, "")) as Manifest;
}

const isWorker = (url: string) => /pdf\.worker/.test(url);

/**
 * The first-load and may-load-later gzip KB of a route: from the manifest (entry, the route and its parents), or,
 * given `served`, from the script URLs the served document names (documentScripts).
 */
export function routeJs(buildDir: string, routeId: string, served?: string[]) {
  const manifest = readManifest(buildDir);
  const client = path.join(buildDir, "client");
  const gz = new Map<string, number>();
  const size = (url: string) => {
    if (!gz.has(url)) gz.set(url, gzipSync(readFileSync(path.join(client, url)), { level: 9 }).length);
    return gz.get(url)!;
  };
  const initial = new Set<string>(served ?? [manifest.entry.module, ...manifest.entry.imports]);
  for (let id: string | undefined = served ? undefined : routeId; id; id = manifest.routes[id]?.parentId) {
    const route = manifest.routes[id];
    if (!route) throw new Error(`route ${id} is not in the manifest`);
    for (const url of [route.module, ...(route.imports ?? [])]) initial.add(url);
  }
  if (served && !manifest.routes[routeId]) throw new Error(`route ${routeId} is not in the manifest`);
  // Dynamic imports, and what those chunks import, statically or not: relative specifiers in the chunk text.
  const lazy = new Set<string>();
  const queue = [...initial];
  while (queue.length) {
    const url = queue.pop()!;
    const code = readFileSync(path.join(client, url), "utf8");
    for (const m of code.matchAll(/["'`](\.{1,2}\/[^"'`]+?\.m?js)["'`]/g)) {
      const dep = path.posix.join(path.posix.dirname(url), m[1]!);
      if (initial.has(dep) || lazy.has(dep) || isWorker(dep)) continue;
      try {
        size(dep);
      } catch {
        continue; // a string that looks like a path but names no file in the build
      }
      lazy.add(dep);
      queue.push(dep);
    }
  }
  const kb = (set: Set<string>) => Math.round(([...set].reduce((n, u) => n + size(u), 0) / 1024) * 10) / 10;
  return { initialKb: kb(initial), lazyKb: kb(lazy), initialFiles: initial.size, lazyFiles: lazy.size };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const buildDir = process.argv[2] ?? process.env.COUNTERSIGN_BUILD_DIR ?? "build";
  const figures: Record<string, number[]> = {};
  const notes: Record<string, unknown> = { buildDir };
  for (const [name, id] of Object.entries(ROUTES) as [keyof typeof ROUTES, string][]) {
    const at = SERVED_PATHS[name];
    const html = at && process.env.APP_URL ? await fetch(new URL(at, process.env.APP_URL)).then((res) => res.text()) : null;
    const r = { ...routeJs(buildDir, id, html === null ? undefined : documentScripts(html)), countedFrom: html === null ? "manifest" : `served ${at}` };
    console.log(`${name.padEnd(8)} first load ${r.initialKb} KB gzip (${r.initialFiles} files, from the ${r.countedFrom}); may load later ${r.lazyKb} KB (${r.lazyFiles} files), pdf.js worker excluded`);
    figures[`${name}.initial_kb`] = [r.initialKb];
    figures[`${name}.lazy_kb`] = [r.lazyKb];
    notes[name] = r;
  }
  writeBench("routes-js", figures, notes);
}
