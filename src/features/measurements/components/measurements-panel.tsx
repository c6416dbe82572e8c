import { useId, useState } from 'react';
import { MEASUREMENT_LIMITS, type MeasurementSet } from '@shared/api/measurements.ts';
import { Button } from '@/components/ui/button.tsx';
import { isApiError } from '@/lib/api-error.ts';
import { useImportMeasurements, useMeasurements } from '../api/measurements.ts';

/**
 * Measured data of an entry: import a CSV (parameter, observed state, optional error columns),
 * see each bad row named by its line, and choose sets to draw over a branch plot. Belongs beside
 * branch cells; `onSelect` hands the chosen sets to the plot (see `withMeasurements`).
 */
export function MeasurementsPanel(props: { notebookId: string; entryId: string; canWrite: boolean; onSelect?: (sets: MeasurementSet[]) => void }) {
  const list = useMeasurements(props.notebookId, props.entryId);
  const importSet = useImportMeasurements(props.notebookId, props.entryId);
  const [name, setName] = useState('');
  const [csv, setCsv] = useState('');
  const [chosen, setChosen] = useState<string[]>([]);
  const ids = { heading: useId(), name: useId(), csv: useId(), file: useId() };
  const problems = isApiError(importSet.error) ? importSet.error.fields : [];

  const toggle = (id: string) => {
    const next = chosen.includes(id) ? chosen.filter((x) => x !== id) : [...chosen, id];
    setChosen(next);
    props.onSelect?.((list.data?.sets ?? []).filter((s) => next.includes(s.id)));
  };

  return (
    <section aria-labelledby={ids.heading} className="rounded-lg border border-rule bg-surface p-4">
      <h2 id={ids.heading} className="font-serif text-lg font-bold text-ink">
        Measured data
      </h2>
      {list.data && list.data.sets.length > 0 ? (
        <ul aria-label="Data sets" className="mt-2 space-y-1 text-sm">
          {list.data.sets.map((s) => (
            <li key={s.id}>
              <label className="inline-flex items-center gap-2">
                <input type="checkbox" checked={chosen.includes(s.id)} onChange={() => toggle(s.id)} />
                <span>
                  {s.name} — {s.rows.length} rows of {s.stateName} against {s.parameterName}
                </span>
              </label>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm text-ink-muted">{list.isPending ? 'Loading…' : 'No measured data yet.'}</p>
      )}
      {props.canWrite && (
        <form
          className="mt-4 space-y-2"
          aria-label="Import measured data"
          onSubmit={(e) => {
            e.preventDefault();
            importSet.mutate({ name, csv }, { onSuccess: () => (setName(''), setCsv('')) });
          }}
        >
          <label htmlFor={ids.name} className="block text-sm font-medium">
            Name of the data set
          </label>
          <input id={ids.name} className="w-full rounded border border-rule-strong px-2 py-1 text-sm" value={name} maxLength={MEASUREMENT_LIMITS.nameMax} onChange={(e) => setName(e.target.value)} />
          <label htmlFor={ids.file} className="block text-sm font-medium">
            CSV file
          </label>
          <input
            id={ids.file}
            type="file"
            accept=".csv,text/csv,text/plain"
            className="text-sm"
            onChange={async (e) => {
              const file = e.target.files?.[0];
              if (file) {
                setCsv(await file.text());
                if (!name) setName(file.name.replace(/\.[^.]+$/, ''));
              }
            }}
          />
          <label htmlFor={ids.csv} className="block text-sm font-medium">
            Or paste it: a header row, then parameter, observed value and optionally error (or error_low and error_high)
          </label>
          <textarea id={ids.csv} rows={5} className="w-full rounded border border-rule-strong px-2 py-1 font-mono text-sm" value={csv} onChange={(e) => setCsv(e.target.value)} />
          {problems.length > 0 && (
            <ul role="alert" aria-label="Problems in the CSV" className="space-y-0.5 text-sm text-unstable">
              {problems.map((p) => (
                <li key={p.path + p.message}>{p.message}</li>
              ))}
            </ul>
          )}
          <Button type="submit" size="sm" busy={importSet.isPending}>
            Import
          </Button>
        </form>
      )}
    </section>
  );
}
