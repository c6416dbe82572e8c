import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { createComment } from '@server/services/comments/create-comment.ts';
import { setThreadResolved } from '@server/services/comments/resolve-comment.ts';
import { loadEntry } from '@server/services/entries/load-entry.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { approveReview } from '@server/services/reviews/approve-review.ts';
import { requestChanges } from '@server/services/reviews/request-changes.ts';
import { submitReview } from '@server/services/reviews/submit-review.ts';
import { extractCells, type DocNode } from '@shared/editor/document.ts';
import { DEMO_PEOPLE, type DemoPersonKey } from '../demo-people.ts';
import type { ScenarioDeps, SeededEntry } from './record-entries.ts';

/**
 * The review side of the demo, through the review and comment services: one entry approved and
 * signed by the PI (with her demo password, after the cells are rerun), one sent back with
 * changes requested, one waiting in the PI's queue, and comment threads (one resolved).
 */

type Act<T> = (ctx: ActingContext, entry: EntryEntity) => Promise<T>;

async function as<T>(deps: ScenarioDeps, who: DemoPersonKey, seeded: SeededEntry, act: Act<T>): Promise<T> {
  return deps.dataSource.transaction(async (manager) => {
    const ctx: ActingContext = { actor: deps.people[who], manager };
    const entry = await loadEntry(ctx, {
      notebookId: seeded.entry.notebookId,
      entryId: seeded.entry.id,
      action: 'read',
      lock: true,
    });
    return act(ctx, entry);
  });
}

function entryOf(entries: Map<string, SeededEntry>, key: string): SeededEntry {
  const found = entries.get(key);
  if (!found) throw new Error(`The demo scenario has no entry "${key}"`);
  return found;
}

/** Index of the first top-level block whose text contains `words` (comments are anchored to blocks). */
function blockWith(seeded: SeededEntry, words: string): number {
  const blocks = (seeded.head.document.content ?? []) as DocNode[];
  const text = (node: DocNode): string => (node.text ?? '') + (node.content ?? []).map(text).join('');
  const index = blocks.findIndex((b) => text(b).includes(words));
  if (index < 0) throw new Error(`No block of "${seeded.entry.title}" contains "${words}"`);
  return index;
}

function cellOfKind(seeded: SeededEntry, kind: string): string {
  const cell = extractCells(seeded.head.document).find((c) => c.kind === kind);
  if (!cell) throw new Error(`"${seeded.entry.title}" has no ${kind} cell`);
  return cell.id;
}

export async function seedReviewsAndComments(
  deps: ScenarioDeps,
  entries: Map<string, SeededEntry>,
): Promise<void> {
  const { publicUrl } = deps;
  const submit = (key: string, note: string) => {
    const seeded = entryOf(entries, key);
    return as(deps, 'researcher', seeded, (ctx, entry) =>
      submitReview(ctx, { entry, publicUrl, revisionId: seeded.head.id, note }),
    );
  };

  // Approved and signed: the steady states of the tank.
  const steady = entryOf(entries, 'tank-steady-states');
  await submit(
    'tank-steady-states',
    'Steady states at two residence times, with the interpretation. Ready for your review.',
  );
  await approveReview(
    { dataSource: deps.dataSource, reruns: { pool: deps.pool }, publicUrl },
    {
      actor: deps.people.pi,
      notebookId: steady.entry.notebookId,
      entryId: steady.entry.id,
      revisionId: steady.head.id,
      password: DEMO_PEOPLE.pi.password,
      acceptDifferences: false,
    },
  );

  // Changes requested: the branch entry.
  const branch = entryOf(entries, 'tank-branch');
  await submit('tank-branch', 'Both folds located and the jump past ignition simulated.');
  await as(deps, 'pi', branch, (ctx, entry) =>
    requestChanges(ctx, {
      entry,
      revisionId: branch.head.id,
      comment:
        'Good work on the folds. Before I sign: please add the return jump too, a trajectory started hot just below the extinction value, so the entry shows both sides of the hysteresis loop.',
      publicUrl,
    }),
  );

  // Pending in the PI's queue: the fold map.
  await submit('tank-fold-map', 'Fold map in (Da, B) with the cusps, and the check below them at B = 7.');

  /** A comment by `who` on the entry's newest revision, on a block (found by its words) or on the first cell of a kind. */
  const comment = (
    who: DemoPersonKey,
    seeded: SeededEntry,
    on: { words: string } | { cellKind: string },
    body: string,
    parentId?: string,
  ) => {
    const place =
      'words' in on
        ? { blockIndex: blockWith(seeded, on.words) }
        : { cellId: cellOfKind(seeded, on.cellKind) };
    return as(deps, who, seeded, (ctx, entry) =>
      createComment(ctx, {
        entry,
        publicUrl,
        anchor: { revisionId: seeded.head.id, ...place },
        body,
        ...(parentId ? { parentId } : {}),
      }),
    );
  };

  // A thread on the lake states, answered and resolved.
  const lakeStates = entryOf(entries, 'lake-states');
  const values = { words: 'Our values' };
  const question = await comment(
    'pi',
    lakeStates,
    values,
    'Where does the loss rate b = 0.8 come from? Please say in the entry that it is our own estimate, not a measured value.',
  );
  await comment(
    'researcher2',
    lakeStates,
    values,
    '@Ines Halvorsen It is our own round figure for flushing plus burial; the paragraph in the latest revision says so.',
    question.id,
  );
  await as(deps, 'researcher2', lakeStates, (ctx, entry) =>
    setThreadResolved(ctx, { entry, commentId: question.id, resolved: true }),
  );

  // An open question from the reader on the lake trajectory, mentioning the author.
  await comment(
    'reader',
    entryOf(entries, 'lake-branch'),
    { cellKind: 'trajectory' },
    '@Mira Castellanos How long would the switch to the turbid state take in years, if one time unit is a season?',
  );

  // A discussion on the gene switch fold map, still open.
  const gene = entryOf(entries, 'gene-branch');
  const onMap = { cellKind: 'fold-map' };
  const remark = await comment(
    'pi',
    gene,
    onMap,
    'The cusp sits where the two synthesis rates are equal. Is that forced by the symmetry of the exponents?',
  );
  await comment(
    'researcher',
    gene,
    onMap,
    'Yes, with equal exponents the model is symmetric under swapping u and v, so the cusp lies on the diagonal. I will try unequal exponents next.',
    remark.id,
  );
}
