/**
 * Benchmarks for this machine: `npm run bench` runs every section; name sections to run only
 * those: `npm run bench -- engine`, `npm run bench -- client http`.
 *   engine  numerical engine speed (bench/engine.ts)
 *   runs    small uncached cell runs through the API one at a time: the cost of the run's path (bench/cell-runs.ts)
 *   client  client JS size: the first page against lazy chunks, where the heavy libraries are (bench/client-size.ts)
 *   http    HTTP load on the real server with autocannon (bench/http-load.ts); its length, people and share of
 *           uncached runs come from --seconds=N --clients=N --miss-share=F, or BENCH_HTTP_SECONDS,
 *           BENCH_HTTP_CLIENTS, BENCH_HTTP_MISS_SHARE (defaults 30 s, 50 people, 0.25)
 * Exits with status 1 when a section that checks a rule (client, http) fails it; engine and runs print
 * their goals (speed on a shared machine is noisy) without failing.
 */
import path from 'node:path';
import type { HttpLoadOptions } from './http-load.ts';

const SECTIONS = ['engine', 'runs', 'client', 'http'] as const;
const HTTP_LOAD_DEFAULTS: HttpLoadOptions = { seconds: 30, clients: 50, missShare: 0.25 };
type Section = (typeof SECTIONS)[number];

const args = process.argv.slice(2);
const flags = new Map(args.filter((a) => a.startsWith('--')).map((a) => a.slice(2).split('=') as [string, string]));
const named = args.filter((a) => !a.startsWith('--'));
const unknown = [...named.filter((a) => !SECTIONS.includes(a as Section)), ...[...flags.keys()].filter((f) => !['seconds', 'clients', 'miss-share'].includes(f))];
if (unknown.length) {
  console.error(`Unknown section or flag: ${unknown.join(', ')}. Sections: ${SECTIONS.join(', ')}; flags: --seconds=N --clients=N --miss-share=F`);
  process.exit(2);
}
const sections = new Set<Section>(named.length ? (named as Section[]) : SECTIONS);

function numberOption(flag: string, variable: string, fallback: number, valid: (n: number) => boolean): number {
  const raw = flags.get(flag) ?? process.env[variable];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!valid(value)) {
    console.error(`--${flag} / ${variable}: "${raw}" is not valid`);
    process.exit(2);
  }
  return value;
}
const httpOptions: HttpLoadOptions = {
  seconds: numberOption('seconds', 'BENCH_HTTP_SECONDS', HTTP_LOAD_DEFAULTS.seconds, (n) => Number.isInteger(n) && n >= 1 && n <= 600),
  clients: numberOption('clients', 'BENCH_HTTP_CLIENTS', HTTP_LOAD_DEFAULTS.clients, (n) => Number.isInteger(n) && n >= 1 && n <= 500),
  missShare: numberOption('miss-share', 'BENCH_HTTP_MISS_SHARE', HTTP_LOAD_DEFAULTS.missShare, (n) => n >= 0 && n <= 1),
};

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
let ok = true;
if (sections.has('engine')) await import('./engine.ts');
if (sections.has('runs')) await (await import('./cell-runs.ts')).runCellRunsBench();
if (sections.has('client')) ok = (await import('./client-size.ts')).runClientSizeBench(root).ok && ok;
if (sections.has('http')) ok = (await (await import('./http-load.ts')).runHttpLoadBench(httpOptions)).ok && ok;
if (!ok) process.exitCode = 1;
