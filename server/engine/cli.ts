/**
 * Command line: `npm run --silent analyze -- FILE.json` (or `-` for standard input).
 * Prints the result JSON and exits 0 — also on a numerical failure, which the result's stop
 * reason reports. A bad request prints { "error": { code, message, path?, position? } } and
 * exits 2. An internal fault prints { "error": { "code": "internal_error", ... } } and exits 1.
 */
import { readFileSync } from 'node:fs';
import { ENGINE_ERROR_CODES } from '@shared/engine/contract.ts';
import { analyze } from './analyze.ts';
import { EngineRequestError } from './errors.ts';

function readInput(file: string | undefined): string {
  if (!file) throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: 'Usage: npm run --silent analyze -- FILE.json   (or - to read standard input)' });
  try {
    return readFileSync(file === '-' ? 0 : file, 'utf8');
  } catch (error) {
    throw new EngineRequestError({ code: ENGINE_ERROR_CODES.invalidRequest, message: `Cannot read ${file}: ${(error as Error).message}` });
  }
}

function main(argv: string[]): number {
  try {
    const text = readInput(argv[0]);
    let request: unknown;
    try {
      request = JSON.parse(text);
    } catch (error) {
      const m = /position (\d+)/.exec((error as Error).message);
      throw new EngineRequestError({ code: ENGINE_ERROR_CODES.malformedJson, message: `The request is not valid JSON: ${(error as Error).message}`, ...(m ? { position: Number(m[1]) } : {}) });
    }
    process.stdout.write(`${JSON.stringify(analyze(request))}\n`);
    return 0;
  } catch (error) {
    if (error instanceof EngineRequestError) {
      process.stdout.write(`${JSON.stringify(error.toJSON())}\n`);
      return 2;
    }
    process.stdout.write(`${JSON.stringify({ error: { code: 'internal_error', message: error instanceof Error ? error.message : String(error) } })}\n`);
    return 1;
  }
}

process.exitCode = main(process.argv.slice(2));
