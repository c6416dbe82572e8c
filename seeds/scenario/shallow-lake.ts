import type { ModelCellInput } from '@shared/cells/inputs.ts';
import type { DocumentCell } from '@shared/editor/document.ts';
import { bold, bullets, displayMath, heading, math, newCellId, num, paragraph, steps } from './doc.ts';
import { countWord, cuspsOf, describePoint, equilibriaBy, foldAt, jumpOf, twoFolds } from './quote.ts';
import { branchCell, equilibriaCell, foldMapCell, modelCell, place, trajectoryCell } from './cells.ts';
import type { CellResults, ScenarioEntry, ScenarioNotebook } from './types.ts';

/**
 * Notebook "Shallow lake: clear and turbid states" (Mira Castellanos). The model is the
 * one-variable phosphorus balance of Carpenter, Ludwig and Brock (Ecological Applications 9, 1999):
 * loading a, loss rate b, recycling from the sediment r·x^q/(1 + x^q); the values are the group's own.
 */

const lakeModel = (a: number): ModelCellInput => ({
  name: 'Shallow lake phosphorus balance',
  variables: [{ name: 'x', rhs: 'a - b*x + r*x^q/(1 + x^q)', note: 'Phosphorus in the water (scaled)' }],
  parameters: [
    { name: 'a', value: a, note: 'Loading from the catchment' },
    { name: 'b', value: 0.8, note: 'Loss by flushing and burial' },
    { name: 'r', value: 1, note: 'Largest recycling rate from the sediment' },
    { name: 'q', value: 8, note: 'Steepness of the recycling switch' },
  ],
  definitions: [],
});

const lakeCell = (id: string, a: number): DocumentCell => modelCell(id, lakeModel(a));
const EQUATION = String.raw`\dot x = a - b\,x + r\,\frac{x^q}{1 + x^q}`;
const VALUES = paragraph(
  'Our values: ',
  math('b = 0.8'),
  ', ',
  math('r = 1'),
  ', ',
  math('q = 8'),
  '. The loss rate b = 0.8 is our own estimate of flushing plus burial, not a measured value.',
);

function statesEntry(): ScenarioEntry {
  const model = newCellId();
  const equilibria = newCellId();
  const cellsAt = (a: number): DocumentCell[] => [
    lakeCell(model, a),
    equilibriaCell(equilibria, model, { x: [0, 4] }),
  ];
  const body = (a: number, withReading: boolean) => (r: CellResults) => {
    const points = equilibriaBy(r.equilibria(equilibria), 'x');
    const stable = points.filter((p) => p.stability === 'stable');
    return [
      heading(2, 'Aim'),
      paragraph(
        'Find the steady phosphorus levels of the lake under the present catchment loading, with the balance',
      ),
      displayMath(EQUATION),
      VALUES,
      ...cellsAt(a).map(place),
      heading(2, 'Steady states'),
      paragraph(
        `At a loading of a = ${num(a)} there ${points.length === 1 ? 'is' : 'are'} ${countWord(points.length, 'equilibrium', 'equilibria')} between x = 0 and x = 4:`,
      ),
      bullets(...points.map((p) => [describePoint(p, ['x'])])),
      ...(withReading
        ? [
            heading(2, 'Reading'),
            paragraph(
              stable.length === 2
                ? `Two stable states coexist: a clear lake with x = ${num(stable[0].state.x)} and a turbid one with x = ${num(stable[1].state.x)}, about ${num(stable[1].state.x / stable[0].state.x, 2)} times as rich in phosphorus. The unstable state between them marks how large a pulse of phosphorus tips the clear lake over.`
                : `Only ${countWord(stable.length, 'stable state', 'stable states')} at this loading.`,
            ),
            steps(
              ['Follow the states in the loading ', math('a'), '.'],
              ['Simulate a lake that starts clear under a raised loading.'],
            ),
          ]
        : []),
    ];
  };
  return {
    key: 'lake-states',
    title: 'Clear and turbid states under the present loading',
    daysAgo: 5,
    tags: ['lake', 'equilibria'],
    author: 'researcher2',
    revisions: [
      {
        author: 'researcher2',
        message: 'First draft at a = 0.2',
        cells: cellsAt(0.2),
        body: body(0.2, false),
      },
      {
        author: 'researcher2',
        message: 'Loading raised to a = 0.3 (new catchment estimate); rerun',
        cells: cellsAt(0.3),
        body: body(0.3, false),
      },
      {
        author: 'researcher2',
        message: 'Reading of the two stable states',
        cells: cellsAt(0.3),
        body: body(0.3, true),
      },
    ],
  };
}

function branchEntry(): ScenarioEntry {
  const model = newCellId();
  const branch = newCellId();
  const trajectory = newCellId();
  const branchOfA = branchCell(branch, model, {
    parameter: 'a',
    start: { x: 0.3 },
    bounds: [0, 1],
    yVariable: 'x',
  });
  const clearStart = trajectoryCell(trajectory, model, { initial: { x: 0.6 }, end: 40 });
  const draft = [lakeCell(model, 0.3), branchOfA];
  const full = [lakeCell(model, 0.55), branchOfA, clearStart];
  const folds = (r: CellResults) => {
    const [recovery, loss] = twoFolds(r.branch(branch), 'lake branch');
    return [
      heading(2, 'Folds'),
      bullets(
        [
          bold('Clear state lost: '),
          `the clear branch ends at the ${foldAt('a', loss)} (x = ${num(loss.state.x)}).`,
        ],
        [
          bold('Turbid state lost: '),
          `the turbid branch ends at the ${foldAt('a', recovery)} (x = ${num(recovery.state.x)}); only below this loading does the lake come back by itself.`,
        ],
      ),
    ];
  };
  const intro = [
    heading(2, 'Aim'),
    paragraph(
      'Follow the steady states in the loading ',
      math('a'),
      ' from 0 to 1 and find the loadings at which each state disappears.',
    ),
  ];
  return {
    key: 'lake-branch',
    title: 'Loading branch: where the clear state is lost',
    daysAgo: 3,
    tags: ['lake', 'continuation', 'hysteresis'],
    author: 'researcher2',
    revisions: [
      {
        author: 'researcher2',
        message: 'Branch in the loading a',
        cells: draft,
        body: (r) => [...intro, ...draft.map(place), ...folds(r)],
      },
      {
        author: 'researcher2',
        message: 'Simulate a clear lake at a = 0.55, past the fold',
        cells: full,
        body: (r) => {
          const [recovery, loss] = twoFolds(r.branch(branch), 'lake branch');
          const jump = jumpOf(r.trajectory(trajectory), 'x');
          return [
            ...intro,
            ...full.slice(0, 2).map(place),
            ...folds(r),
            heading(2, 'Past the fold'),
            paragraph(
              `With the loading at a = 0.55, just above the clear-state fold, a lake that starts clear (x = 0.6) drifts slowly and then turns turbid: x passes half way at t ≈ ${num(jump.halfwayAt, 2)} and settles at x = ${num(jump.to)}.`,
            ),
            place(clearStart),
            heading(2, 'Reading'),
            paragraph(
              `To bring the lake back, the loading must fall below ${num(recovery.parameter)}, a cut of ${num((100 * (loss.parameter - recovery.parameter)) / loss.parameter, 2)} % from the loading at which it was lost: restoring costs far more than preventing.`,
            ),
          ];
        },
      },
    ],
  };
}

function foldMapEntry(): ScenarioEntry {
  const model = newCellId();
  const foldMap = newCellId();
  const cells: DocumentCell[] = [
    lakeCell(model, 0.5),
    foldMapCell(foldMap, model, {
      parameters: ['a', 'b'],
      start: { parameters: { a: 0.51, b: 0.8 }, state: { x: 0.74 } },
      bounds: { a: [-0.5, 2], b: [0.3, 2.5] },
    }),
  ];
  const mapBody = mapBodyOf(cells, foldMap);
  return {
    key: 'lake-fold-map',
    title: 'Fold map in loading and loss rate',
    daysAgo: 0,
    tags: ['lake', 'fold map', 'cusp'],
    author: 'researcher2',
    revisions: [
      {
        author: 'researcher2',
        message: 'Fold curve in (a, b) from the clear-state fold',
        cells,
        body: (r) => mapBody(r, false),
      },
      {
        author: 'researcher2',
        message: 'What the map means for managing the lake',
        cells,
        body: (r) => mapBody(r, true),
      },
    ],
  };
}

function mapBodyOf(cells: DocumentCell[], foldMap: string) {
  return (r: CellResults, withNext: boolean) => {
    const cusps = cuspsOf(r.foldMap(foldMap), ['a', 'b']);
    const cusp = r.foldMap(foldMap).curve.events[0];
    return [
      heading(2, 'Aim'),
      paragraph(
        'How does the bistable range of loadings change with the loss rate ',
        math('b'),
        '? A lake that flushes faster may have no tipping point at all.',
      ),
      ...cells.map(place),
      heading(2, 'Result'),
      paragraph(
        `The two folds of the loading branch form one curve in the (a, b) plane with ${countWord(cusps.length, 'cusp', 'cusps')}` +
          (cusps.length ? `: ${cusps.join('; ')}.` : '.'),
      ),
      ...(cusp
        ? [
            paragraph(
              `For loss rates above b = ${num(cusp.parameters.b)} the lake has a single steady state at every loading, and a rising load makes it murkier gradually rather than suddenly.`,
            ),
          ]
        : []),
      ...(withNext
        ? [
            heading(2, 'For management'),
            bullets(
              [
                'Raising the loss rate (flushing, dredging) shrinks the range of loadings with two states and, past the cusp, removes the tipping point.',
              ],
              ...(cusp && cusp.parameters.b > 0.8
                ? [
                    [
                      `Our present b = 0.8 is below the cusp value ${num(cusp.parameters.b)}: the lake can tip, so loading should stay below the clear-state fold with a margin.`,
                    ],
                  ]
                : []),
            ),
          ]
        : []),
    ];
  };
}

export const shallowLakeScenario = (): ScenarioNotebook => ({
  notebook: 'shallowLake',
  entries: [statesEntry(), branchEntry(), foldMapEntry()],
});
