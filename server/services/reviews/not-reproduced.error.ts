import type { ReproducibilityReport } from '@shared/api/reviews.ts';
import { HttpError } from '@server/errors/http.error.ts';

/** 409 with code "not_reproduced": the rerun differs and the PI did not say to sign anyway. */
export class NotReproducedError extends HttpError {
  constructor(readonly report: ReproducibilityReport) {
    super(409, 'not_reproduced', 'Rerunning the cells did not reproduce the stored results; sign with acceptDifferences to approve anyway', [
      { path: 'acceptDifferences', message: 'Confirm that you approve although the results differ' },
    ]);
  }

  override toBody() {
    const body = super.toBody();
    return { error: { ...body.error, reproducibility: this.report } };
  }
}
