import { createHash } from 'node:crypto';
import type { ImportMeasurementsInput } from '@shared/api/measurements.ts';
import type { EntryEntity } from '@server/entities/entry.entity.ts';
import { MeasurementSetEntity } from '@server/entities/measurement-set.entity.ts';
import { NotFoundError, ValidationError } from '@server/errors/index.ts';
import { recordEvent } from '@server/services/audit/record-event.ts';
import type { ActingContext } from '@server/services/entries/service-context.ts';
import { isUuid } from '@server/services/ids.ts';
import { parseMeasurementsCsv } from './parse-measurements-csv.ts';

/** Validates the CSV and stores the data set with its "measurements.imported" event. Bad rows: 400 naming each line. */
export async function importMeasurements(
  ctx: ActingContext,
  props: { entry: EntryEntity; input: Required<Pick<ImportMeasurementsInput, 'name' | 'csv'>> & Pick<ImportMeasurementsInput, 'parameterColumn' | 'stateColumn'> },
): Promise<MeasurementSetEntity> {
  const { entry, input } = props;
  const parsed = parseMeasurementsCsv(input.csv, input);
  if (!parsed.ok) throw new ValidationError('Some rows of the CSV are not valid', parsed.problems);
  const sha256 = createHash('sha256').update(input.csv).digest('hex');
  const row = ctx.manager.create(MeasurementSetEntity, {
    notebookId: entry.notebookId,
    entryId: entry.id,
    name: input.name,
    parameterName: parsed.value.parameterName,
    stateName: parsed.value.stateName,
    rows: parsed.value.rows,
    sha256,
    createdById: ctx.actor.id,
  });
  await ctx.manager.insert(MeasurementSetEntity, row);
  await recordEvent(ctx.manager, {
    actorId: ctx.actor.id,
    action: 'measurements.imported',
    entityType: 'measurement_set',
    entityId: row.id,
    notebookId: entry.notebookId,
    summary: { entryId: entry.id, name: input.name, rows: parsed.value.rows.length, sha256 },
  });
  return ctx.manager.findOneOrFail(MeasurementSetEntity, { where: { id: row.id }, relations: { createdBy: true } });
}

export function listMeasurementSets(ctx: ActingContext, entry: EntryEntity): Promise<MeasurementSetEntity[]> {
  return ctx.manager.find(MeasurementSetEntity, { where: { entryId: entry.id }, relations: { createdBy: true }, order: { createdAt: 'DESC' } });
}

export async function loadMeasurementSet(ctx: ActingContext, entry: EntryEntity, setId: string): Promise<MeasurementSetEntity> {
  if (!isUuid(setId)) throw new NotFoundError('No such data set');
  const row = await ctx.manager.findOne(MeasurementSetEntity, { where: { id: setId, entryId: entry.id }, relations: { createdBy: true } });
  if (!row) throw new NotFoundError('No such data set');
  return row;
}
