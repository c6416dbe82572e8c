import type { Signature } from '@shared/api/reviews.ts';
import type { SignatureEntity } from '@server/entities/signature.entity.ts';

/** A signature with its signer loaded. */
export type SignatureWithSigner = SignatureEntity & { signer: { id: string; name: string } };

/** What 21 CFR Part 11 §11.50 asks a signed record to show: printed name, date and time, meaning. */
export function presentSignature(s: SignatureWithSigner): Signature {
  return {
    id: s.id,
    revisionId: s.revisionId,
    contentHash: s.contentHash,
    signer: { id: s.signer.id, name: s.signer.name },
    printedName: s.printedName,
    meaning: s.meaning,
    signedAt: s.signedAt.toISOString(),
    reproducibility: s.reproducibility,
  };
}
