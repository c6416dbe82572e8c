import type { DataSource } from 'typeorm';
import type { AnalysisPool } from '@server/analysis/analysis-pool.ts';
import { EntryEntity } from '@server/entities/entry.entity.ts';
import type { NotebookEntity } from '@server/entities/notebook.entity.ts';
import type { RevisionEntity } from '@server/entities/revision.entity.ts';
import type { UserEntity } from '@server/entities/user.entity.ts';
import type { FileStorage } from '@server/storage/file-storage.ts';
import { runCellInPool } from '@server/services/analysis/run-cell.ts';
import { createEntry } from '@server/services/entries/create-entry.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import { recordRevision } from '@server/services/revisions/record-revision.ts';
import { isAnalysisKind } from '@shared/cells/kinds.ts';
import { resultFor, type CellOutput, type CellOutputs } from '@shared/cells/output.ts';
import { resolveFromCells } from '@shared/cells/resolve.ts';
import { documentSchema, type DocumentCell } from '@shared/editor/document.ts';
import type { DemoNotebookKey, DemoPersonKey } from '../demo-people.ts';
import { dayBefore, doc } from './doc.ts';
import type { CellResults, ScenarioEntry, ScenarioNotebook } from './types.ts';

export interface ScenarioDeps {
  dataSource: DataSource;
  pool: AnalysisPool;
  publicUrl: string;
  people: Record<DemoPersonKey, UserEntity>;
  notebooks: Record<DemoNotebookKey, NotebookEntity>;
  today: Date;
  /** Where attachments and figures go; without it the seed makes neither. */
  storage?: FileStorage;
}

/** A seeded entry and its newest revision, by scenario key. */
export interface SeededEntry {
  entry: EntryEntity;
  head: RevisionEntity;
}

/**
 * Runs every analysis cell of a revision through the run service, as the editor's run button
 * does, and returns the outputs to record. A cell whose request does not resolve, or whose run
 * fails, stops the seed: the demo shows only real, successful results.
 */
async function runCells(
  deps: ScenarioDeps,
  actor: UserEntity,
  entry: EntryEntity,
  cells: DocumentCell[],
): Promise<CellOutputs> {
  const outputs: CellOutputs = {};
  for (const cell of cells) {
    if (!isAnalysisKind(cell.kind)) continue;
    const resolution = resolveFromCells(cells, cell);
    if (!resolution.ok) {
      throw new Error(
        `Demo cell ${cell.kind} in "${entry.title}" does not resolve: ${resolution.problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`,
      );
    }
    const response = await runCellInPool(deps, { actor, entry, cellId: cell.id, request: resolution.request });
    const { cached: _cached, ...output } = response;
    if (output.status !== 'ok') {
      throw new Error(
        `Demo cell ${cell.kind} in "${entry.title}" failed: ${output.error?.message ?? 'no result'}`,
      );
    }
    outputs[cell.id] = output satisfies CellOutput;
  }
  return outputs;
}

function resultsOf(cells: DocumentCell[], outputs: CellOutputs): CellResults {
  const pick = <K extends 'equilibria' | 'branch' | 'fold-map' | 'trajectory'>(kind: K, cellId: string) => {
    const cell = cells.find((c) => c.id === cellId);
    const result = cell?.kind === kind ? resultFor(kind, outputs[cellId]) : null;
    if (!result) throw new Error(`Demo prose quotes a ${kind} cell (${cellId}) that has no result`);
    return result;
  };
  return {
    equilibria: (id) => pick('equilibria', id),
    branch: (id) => pick('branch', id),
    foldMap: (id) => pick('fold-map', id),
    trajectory: (id) => pick('trajectory', id),
    outputs,
  };
}

/** Creates one scenario entry and saves its revisions in order, each in its own transaction. */
async function seedEntry(
  deps: ScenarioDeps,
  notebook: NotebookEntity,
  scenario: ScenarioEntry,
): Promise<SeededEntry> {
  const entryDate = dayBefore(deps.today, scenario.daysAgo);
  const author = deps.people[scenario.author];
  const created = await deps.dataSource.transaction((manager) =>
    createEntry(
      { actor: author, manager },
      { notebookId: notebook.id, title: scenario.title, entryDate, tags: scenario.tags },
    ),
  );
  let head = created.head as RevisionEntity;
  for (const revision of scenario.revisions) {
    const actor = deps.people[revision.author];
    const outputs = await runCells(deps, actor, created.entry, revision.cells);
    const document = documentSchema.parse(doc(...revision.body(resultsOf(revision.cells, outputs))));
    head = await deps.dataSource.transaction(async (manager) => {
      const ctx = { actor, manager };
      const entry = await loadEntry(ctx, {
        notebookId: notebook.id,
        entryId: created.entry.id,
        action: 'write',
        lock: true,
      });
      return recordRevision(ctx, {
        entry,
        baseRevisionId: entry.headRevisionId,
        title: scenario.title,
        entryDate,
        tags: scenario.tags,
        document,
        outputs,
        message: revision.message,
      });
    });
  }
  const entry = await deps.dataSource.manager.findOneByOrFail(EntryEntity, { id: created.entry.id });
  return { entry, head };
}

/** Seeds every entry of the scenario notebooks; answers the seeded entries by scenario key. */
export async function seedScenarioEntries(
  deps: ScenarioDeps,
  scenarios: ScenarioNotebook[],
): Promise<Map<string, SeededEntry>> {
  const seeded = new Map<string, SeededEntry>();
  for (const scenario of scenarios) {
    const notebook = deps.notebooks[scenario.notebook];
    for (const entry of scenario.entries) {
      if (seeded.has(entry.key)) throw new Error(`Two demo entries share the key ${entry.key}`);
      seeded.set(entry.key, await seedEntry(deps, notebook, entry));
    }
  }
  return seeded;
}
