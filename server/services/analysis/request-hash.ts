import { createHash } from 'node:crypto';
import { hashPayload } from '@shared/cells/hash.ts';
import { analyzeRequestSchema } from '@shared/engine/contract.ts';

/**
 * The input hash of a cell run: sha256 hex of canonicalJson({ engineVersion, model, task }).
 * A request that passes the contract is hashed with its defaults filled in, so it matches the
 * hash the client computes from the resolved cell request; one that does not is hashed as sent.
 */
export function requestInputHash(engineVersion: string, request: { model: unknown; task: unknown }): string {
  const parsed = analyzeRequestSchema.safeParse({ model: request.model, task: request.task });
  const subject = parsed.success ? { model: parsed.data.model, task: parsed.data.task } : request;
  return createHash('sha256').update(hashPayload(engineVersion, subject)).digest('hex');
}
