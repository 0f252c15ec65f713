import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';

/** The JavaScript a first visit downloads before any lazy route, and its size. */
export interface InitialScripts {
  /** Files named by index.html: `<script src>` and `<link rel="modulepreload" href>`. */
  listed: string[];
  /**
   * Files the listed ones import statically (`import … from "./x.js"`, `import "./x.js"`) but
   * index.html does not name: the browser fetches them before the app starts all the same (the
   * Angular builder writes at most ten modulepreload hints). Dynamic `import("./x.js")` — lazy
   * routes and charts — is not followed.
   */
  unlisted: string[];
  rawBytes: number;
  /** Sum of each file gzipped with node:zlib at level 9 (as a server compressing ahead of time would). */
  gzipBytes: number;
}

const SCRIPT_SRC = /<script\b[^>]*\bsrc="([^"]+\.js)"/g;
const MODULE_PRELOAD = /<link\b[^>]*\brel="modulepreload"[^>]*\bhref="([^"]+\.js)"|<link\b[^>]*\bhref="([^"]+\.js)"[^>]*\brel="modulepreload"/g;
// Minified static imports: `from"./chunk-X.js"` and the side-effect form `import"./chunk-X.js"`; never `import("…")`.
const STATIC_IMPORT = /(?:\bfrom|\bimport)\s*["']\.\/([\w.-]+\.js)["']/g;

/** Reads index.html in `browserDir` and follows the static imports of the scripts it names. */
export function initialScripts(browserDir: string): InitialScripts {
  const html = readFileSync(path.join(browserDir, 'index.html'), 'utf8');
  const listed = new Set<string>();
  for (const match of html.matchAll(SCRIPT_SRC)) listed.add(match[1]);
  for (const match of html.matchAll(MODULE_PRELOAD)) listed.add(match[1] ?? match[2]);
  if (listed.size === 0) throw new Error(`${browserDir}/index.html names no script.`);

  const all = new Set<string>();
  const pending = [...listed];
  let rawBytes = 0;
  let gzipBytes = 0;
  while (pending.length > 0) {
    const file = pending.pop();
    if (file === undefined || all.has(file)) continue;
    all.add(file);
    const bytes = readFileSync(path.join(browserDir, file));
    rawBytes += bytes.length;
    gzipBytes += gzipSync(bytes, { level: 9 }).length;
    for (const match of bytes.toString('utf8').matchAll(STATIC_IMPORT)) pending.push(match[1]);
  }
  return { listed: [...listed], unlisted: [...all].filter((file) => !listed.has(file)), rawBytes, gzipBytes };
}
