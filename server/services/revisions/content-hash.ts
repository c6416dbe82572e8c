import { createHash } from 'node:crypto';
import { canonicalJson } from '@shared/cells/hash.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import type { DocumentJson } from '@shared/editor/document.ts';

export interface RevisionContent {
  title: string;
  entryDate: string;
  tags: string[];
  document: DocumentJson;
  outputs: CellOutputs;
}

/** sha256 hex of canonicalJson({ title, entryDate, tags, document, outputs }): what a signature binds to. */
export function revisionContentHash(content: RevisionContent): string {
  const { title, entryDate, tags, document, outputs } = content;
  return createHash('sha256').update(canonicalJson({ title, entryDate, tags, document, outputs })).digest('hex');
}
