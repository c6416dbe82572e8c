/**
 * Client JS size: builds the client into a temp folder and reports, gzipped (level 9), the JS the
 * first page loads (index.html's entry script and modulepreload links, plus every static import
 * the manifest lists from there) against the lazily loaded chunks, the JS each main route adds,
 * and which chunks hold the heavy libraries (vega / vega-lite, the editor, KaTeX, mathjs; listed
 * in scripts/heavy-chunks.ts). Passes when each heavy library sits only in its own chunk and none
 * of those chunks is loaded by the first page.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { buildClientIfStale } from '../scripts/client-build.ts';
import { HEAVY_CHUNKS } from '../scripts/heavy-chunks.ts';
import { printTable } from './report.ts';

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
}
type Manifest = Record<string, ManifestChunk>;

/** The routes whose own JS (beyond the first page's) is worth a line: where people spend their time. */
const ROUTES = ['notebooks', 'notebook', 'entry', 'methods'].map((name) => `src/app/routes/${name}.tsx`);

const kb = (bytes: number) => `${(bytes / 1024).toFixed(1)} KB`;

/** Every chunk `key` loads before it runs: itself and its static imports, recursively. */
function staticClosure(manifest: Manifest, keys: string[]): Set<string> {
  const seen = new Set<string>();
  const visit = (key: string) => {
    if (seen.has(key) || !manifest[key]) return;
    seen.add(key);
    for (const next of manifest[key].imports ?? []) visit(next);
  };
  keys.forEach(visit);
  return seen;
}

/** The script and modulepreload URLs of the built index.html (what the browser fetches first). */
function initialUrls(html: string): string[] {
  const urls = [...html.matchAll(/<script[^>]*type="module"[^>]*src="([^"]+)"/g), ...html.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)].map((m) => m[1]);
  return urls.map((u) => u.replace(/^\//, ''));
}

export interface ClientSizeReport {
  ok: boolean;
}

export function runClientSizeBench(root: string): ClientSizeReport {
  const outDir = mkdtempSync(path.join(os.tmpdir(), 'bifolio-client-size-'));
  try {
    buildClientIfStale(root, outDir, (line) => console.log(line));
    const manifest = JSON.parse(readFileSync(path.join(outDir, '.vite/manifest.json'), 'utf8')) as Manifest;
    const html = readFileSync(path.join(outDir, 'index.html'), 'utf8');
    const keyOfFile = new Map(Object.entries(manifest).map(([key, chunk]) => [chunk.file, key]));

    const jsFiles = readdirSync(path.join(outDir, 'assets')).filter((f) => f.endsWith('.js')).map((f) => `assets/${f}`);
    const gz = new Map(jsFiles.map((f) => [f, gzipSync(readFileSync(path.join(outDir, f)), { level: 9 }).length]));
    const size = (files: Iterable<string>) => [...files].reduce((sum, f) => sum + (gz.get(f) ?? 0), 0);

    // The first page: index.html's scripts and preloads, and what they import statically.
    const htmlFiles = initialUrls(html);
    const initialKeys = staticClosure(manifest, htmlFiles.map((f) => keyOfFile.get(f) ?? '').filter(Boolean));
    const initial = new Set([...htmlFiles, ...[...initialKeys].map((k) => manifest[k].file)]);
    const initialBytes = size(initial);
    const totalBytes = size(jsFiles);

    // Which chunks hold each heavy library, from the source maps' module lists.
    const sourcesOf = (file: string): string[] => {
      try {
        return (JSON.parse(readFileSync(path.join(outDir, `${file}.map`), 'utf8')) as { sources: string[] }).sources;
      } catch {
        return [];
      }
    };
    const chunkSources = new Map(jsFiles.map((f) => [f, sourcesOf(f)]));
    const heavy = HEAVY_CHUNKS.map((lib) => {
      const holders = jsFiles.filter((f) => chunkSources.get(f)?.some((s) => lib.test.test(s)));
      // Its own chunk: one chunk named after it, holding only packages (the library and what it
      // depends on alone), no application code and no other heavy library.
      const others = HEAVY_CHUNKS.filter((o) => o !== lib);
      const own =
        holders.length === 1 &&
        path.basename(holders[0]).startsWith(`${lib.name}-`) &&
        (chunkSources.get(holders[0]) ?? []).every((s) => (/[\\/]node_modules[\\/]/.test(s) || s.includes('vite-browser-external')) && !others.some((o) => o.test.test(s)));
      const inInitial = holders.filter((f) => initial.has(f));
      return { lib, holders, own, inInitial, ok: own && inInitial.length === 0 };
    });

    console.log(`\nClient JS (gzip -9), built with vite into ${outDir}`);
    printTable(
      ['part', 'files', 'gzip', 'share'],
      [
        ['first page (index.html entry + static imports)', [...initial].map((f) => path.basename(f)).join(', '), kb(initialBytes), `${((initialBytes / totalBytes) * 100).toFixed(1)} %`],
        ['lazy chunks (routes, libraries)', `${jsFiles.length - initial.size} files`, kb(totalBytes - initialBytes), `${(((totalBytes - initialBytes) / totalBytes) * 100).toFixed(1)} %`],
        ['all JS', `${jsFiles.length} files`, kb(totalBytes), '100 %'],
      ],
    );
    console.log(`ratio first page / all JS: ${(initialBytes / totalBytes).toFixed(3)}`);

    console.log('\nJS each route adds to the first page (its chunk and static imports, gzip):');
    printTable(
      ['route module', 'adds', 'heavy chunks among them'],
      ROUTES.filter((r) => manifest[r]).map((route) => {
        const files = [...staticClosure(manifest, [route])].map((k) => manifest[k].file).filter((f) => !initial.has(f));
        const heavyHere = heavy.filter((h) => h.holders.some((f) => files.includes(f))).map((h) => h.lib.name);
        return [route.replace('src/app/routes/', ''), kb(size(files)), heavyHere.join(', ') || '—'];
      }),
    );

    console.log('\nHeavy libraries:');
    printTable(
      ['library', 'chunk(s)', 'gzip', 'own chunk', 'in first page', 'ok'],
      heavy.map((h) => [h.lib.label, h.holders.map((f) => path.basename(f)).join(', ') || '(not found)', kb(size(h.holders)), h.own ? 'yes' : 'NO', h.inInitial.length ? 'YES' : 'no', h.ok ? 'yes' : 'NO']),
    );
    const ok = heavy.every((h) => h.ok);
    console.log(`${ok ? 'PASS' : 'FAIL'}: ${ok ? 'each heavy library is in its own lazily loaded chunk' : 'a heavy library is mixed into another chunk or loaded by the first page'}`);
    return { ok };
  } finally {
    rmSync(outDir, { recursive: true, force: true });
  }
}
