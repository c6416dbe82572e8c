import type { MeasurementSet } from '@shared/api/measurements.ts';
import type { MeasurementSetEntity } from '@server/entities/measurement-set.entity.ts';

export function presentMeasurementSet(m: MeasurementSetEntity): MeasurementSet {
  return {
    id: m.id,
    entryId: m.entryId,
    name: m.name,
    parameterName: m.parameterName,
    stateName: m.stateName,
    rows: m.rows,
    sha256: m.sha256,
    createdBy: { id: m.createdBy.id, name: m.createdBy.name },
    createdAt: m.createdAt.toISOString(),
  };
}
