import { In, type EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/cells/hash.ts';
import type { CellOutputs } from '@shared/cells/output.ts';
import { AnalysisResultEntity } from '@server/entities/analysis-result.entity.ts';
import { ValidationError, type FieldProblem } from '@server/errors/index.ts';

/**
 * Checks that every successful output about to be recorded is a result this server computed:
 * the stored run for its input hash must exist, from the same engine version, with the same
 * result. A revision (and later a signature on its content hash) then vouches only for real
 * computations. Error outputs carry no result and are kept as they are.
 */
export async function verifyOutputs(manager: EntityManager, outputs: CellOutputs): Promise<void> {
  const claimed = Object.entries(outputs).filter(([, o]) => o.status === 'ok');
  if (claimed.length === 0) return;
  const rows = await manager.find(AnalysisResultEntity, { where: { inputHash: In([...new Set(claimed.map(([, o]) => o.inputHash))]) } });
  const byHash = new Map(rows.map((r) => [r.inputHash, r]));
  const problems: FieldProblem[] = [];
  for (const [cellId, output] of claimed) {
    const stored = byHash.get(output.inputHash);
    if (!stored) {
      problems.push({ path: `outputs.${cellId}.inputHash`, message: 'The server has no run for this input; run the cell again before recording' });
    } else if (stored.engineVersion !== output.engineVersion || canonicalJson(stored.result) !== canonicalJson(output.result)) {
      problems.push({ path: `outputs.${cellId}.result`, message: 'This result differs from the one the server computed for this input; run the cell again' });
    }
  }
  if (problems.length > 0) throw new ValidationError('Some cell outputs were not computed by the server', problems);
}
