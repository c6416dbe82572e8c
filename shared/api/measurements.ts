import { z } from 'zod';
import { personRefSchema } from './entries.ts';

/**
 * Measured data on an entry, imported from CSV, to compare with a branch of the model.
 * Paths are under /api/notebooks/:notebookId/entries/:entryId.
 *
 * POST   /measurements          importMeasurements -> 201 measurementSet | 400 with one field problem per bad row
 * GET    /measurements                             -> measurementSetList (newest first)
 * GET    /measurements/:setId                      -> measurementSet
 *
 * The CSV has a header row. Columns: the parameter (first column unless `parameterColumn` names
 * it), the observed state (second column unless `stateColumn` names it), and optionally the
 * error bar: one column named "error" (± the same amount) or two named "error_low" and
 * "error_high" (amounts below and above the value). Separator "," or ";"; "#" starts a comment
 * line; blank lines are skipped; numbers use "." as the decimal point.
 */
export const MEASUREMENT_LIMITS = {
  /** Characters of CSV text accepted. */
  csvMaxChars: 2_000_000,
  /** Data rows in one set. */
  rowsMax: 20_000,
  /** Characters of the set's name. */
  nameMax: 120,
  /** Bad rows reported one by one before the rest are summarised. */
  problemsReported: 20,
} as const;

export const measurementRowSchema = z.object({
  parameter: z.number(),
  value: z.number(),
  /** Amount below the value (error bar), when given. */
  errorLow: z.number().min(0).optional(),
  /** Amount above the value (error bar), when given. */
  errorHigh: z.number().min(0).optional(),
});
export type MeasurementRow = z.infer<typeof measurementRowSchema>;

export const importMeasurementsSchema = z.object({
  name: z.string().trim().min(1, { message: 'Name the data set' }).max(MEASUREMENT_LIMITS.nameMax),
  csv: z
    .string()
    .min(1, { message: 'Paste or choose a CSV file' })
    .max(MEASUREMENT_LIMITS.csvMaxChars, { message: `At most ${MEASUREMENT_LIMITS.csvMaxChars} characters of CSV` }),
  parameterColumn: z.string().trim().min(1).max(80).optional(),
  stateColumn: z.string().trim().min(1).max(80).optional(),
});
export type ImportMeasurementsInput = z.input<typeof importMeasurementsSchema>;

export const measurementSetSchema = z.object({
  id: z.uuid(),
  entryId: z.uuid(),
  name: z.string(),
  parameterName: z.string(),
  stateName: z.string(),
  rows: z.array(measurementRowSchema),
  sha256: z.string(),
  createdBy: personRefSchema,
  createdAt: z.string(),
});
export type MeasurementSet = z.infer<typeof measurementSetSchema>;

export const measurementSetListSchema = z.object({ sets: z.array(measurementSetSchema) });
export type MeasurementSetList = z.infer<typeof measurementSetListSchema>;
