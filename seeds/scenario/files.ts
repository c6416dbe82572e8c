import { createHash } from 'node:crypto';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { ContinuationResult } from '@shared/engine/contract.ts';
import { resultFor, type CellOutputs } from '@shared/cells/output.ts';
import { extractCells } from '@shared/editor/document.ts';
import { storeAttachment } from '@server/services/attachments/store-attachment.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import { attachFigure } from '@server/services/figures/attach-figure.ts';
import { importMeasurements } from '@server/services/measurements/import-measurements.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { num } from './doc.ts';
import type { ScenarioDeps, SeededEntry } from './record-entries.ts';

/**
 * Files of the demo: a small CSV of pilot-tank readings, invented for the demo and labelled so
 * in the file itself, imported as a data set and attached to the branch entry; and figures of the
 * branch cells rendered by the figure service (the tank's with the readings drawn over it).
 */

/** Residence times of the invented readings: cold side below the extinction fold, hot side above ignition. */
const READING_DA = [0.02, 0.035, 0.05, 0.06, 0.065, 0.09, 0.11, 0.14, 0.18, 0.24];
/** Invented relative scatter of each reading (a thermocouple good to a few per cent). */
const SCATTER = [0.03, -0.02, 0.025, -0.035, 0.01, -0.015, 0.02, -0.01, 0.03, -0.025];

/** The stable temperature rise at `Da`, interpolated between neighbouring stable points of the branch. */
function stableX2At(result: ContinuationResult, Da: number): number {
  const points = result.branch.points;
  for (let i = 1; i < points.length; i++) {
    const [p, q] = [points[i - 1], points[i]];
    if (p.stability !== 'stable' || q.stability !== 'stable') continue;
    const [lo, hi] = p.parameter < q.parameter ? [p, q] : [q, p];
    if (lo.parameter <= Da && Da <= hi.parameter) {
      const t = hi.parameter === lo.parameter ? 0 : (Da - lo.parameter) / (hi.parameter - lo.parameter);
      return lo.state.x2 + t * (hi.state.x2 - lo.state.x2);
    }
  }
  throw new Error(`The tank branch has no stable state at Da = ${Da} for the demo readings`);
}

function branchCellOf(seeded: SeededEntry): { id: string; result: ContinuationResult } {
  const cell = extractCells(seeded.head.document).find((c) => c.kind === 'branch');
  const result = cell ? resultFor('branch', (seeded.head.outputs as CellOutputs)[cell.id]) : null;
  if (!cell || !result) throw new Error(`"${seeded.entry.title}" has no computed branch cell`);
  return { id: cell.id, result };
}

/** The readings CSV: header comments say plainly that the numbers are invented. */
export function pilotReadingsCsv(result: ContinuationResult): string {
  const rows = READING_DA.map(
    (Da, i) =>
      `${Da},${num(stableX2At(result, Da) * (1 + SCATTER[i]), 3)},${num(0.04 * stableX2At(result, Da) + 0.02, 2)}`,
  );
  return [
    '# DEMO DATA, INVENTED: not measured. Made up for the Bifolio demo from the model branch with a few per cent of scatter.',
    '# Pilot tank, steady temperature rise x2 against residence time Da; "error" is the stated reading uncertainty.',
    'Da,x2,error',
    ...rows,
    '',
  ].join('\n');
}

async function attachCsv(
  deps: ScenarioDeps & { storage: FileStorage },
  seeded: SeededEntry,
  name: string,
  csv: string,
): Promise<void> {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'bifolio-seed-'));
  const tempPath = path.join(dir, name);
  await writeFile(tempPath, csv);
  const bytes = Buffer.from(csv);
  await storeAttachment(
    { dataSource: deps.dataSource, storage: deps.storage },
    {
      actor: deps.people.researcher,
      entry: seeded.entry,
      file: {
        name,
        contentType: 'text/csv',
        byteSize: bytes.length,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        tempPath,
        discard: () => rm(dir, { recursive: true, force: true }),
      },
    },
  );
}

/**
 * Imports the invented readings on the tank branch entry; with file storage, also attaches the
 * CSV and renders figures. Without storage (the API tests' database) only the data set is made.
 */
export async function seedFilesAndFigures(
  deps: ScenarioDeps,
  entries: Map<string, SeededEntry>,
): Promise<{ figures: number }> {
  const tank = entries.get('tank-branch');
  const lake = entries.get('lake-branch');
  if (!tank || !lake) throw new Error('The demo scenario lacks the branch entries');
  const tankBranch = branchCellOf(tank);
  const csv = pilotReadingsCsv(tankBranch.result);
  const readings = await deps.dataSource.transaction(async (manager) => {
    const ctx = { actor: deps.people.researcher, manager };
    const entry = await loadEntry(ctx, {
      notebookId: tank.entry.notebookId,
      entryId: tank.entry.id,
      action: 'write',
    });
    return importMeasurements(ctx, {
      entry,
      input: {
        name: 'Pilot tank readings (demo data, invented)',
        csv,
        parameterColumn: 'Da',
        stateColumn: 'x2',
      },
    });
  });
  const { storage } = deps;
  if (!storage) return { figures: 0 };
  const withStorage = { ...deps, storage };
  await attachCsv(withStorage, tank, 'pilot-tank-readings-demo-invented.csv', csv);
  await attachFigure(withStorage, {
    actor: deps.people.researcher,
    entry: tank.entry,
    input: {
      revisionId: tank.head.id,
      cellId: tankBranch.id,
      caption:
        'Steady temperature rise against residence time, with the invented pilot-tank readings (demo data).',
      variable: 'x2',
      measurementSetIds: [readings.id],
    },
  });
  await attachFigure(withStorage, {
    actor: deps.people.researcher2,
    entry: lake.entry,
    input: {
      revisionId: lake.head.id,
      cellId: branchCellOf(lake).id,
      caption: 'Phosphorus in the water against loading: the clear and turbid branches and the two folds.',
      variable: 'x',
      measurementSetIds: [],
    },
  });
  return { figures: 2 };
}
