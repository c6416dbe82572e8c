import type { DocumentCell } from '@shared/editor/document.ts';
import type { ModelCellInput } from '@shared/cells/inputs.ts';
import {
  bold,
  bullets,
  displayMath,
  heading,
  italic,
  math,
  newCellId,
  num,
  paragraph,
  steps,
} from './doc.ts';
import {
  countWord,
  cuspsOf,
  describePoint,
  equilibriaBy,
  foldAt,
  foldsOf,
  jumpOf,
  twoFolds,
} from './quote.ts';
import { branchCell, equilibriaCell, foldMapCell, modelCell, place, trajectoryCell } from './cells.ts';
import type { CellResults, ScenarioEntry, ScenarioNotebook } from './types.ts';

/**
 * Notebook "Stirred-tank ignition and extinction" (Kofi Mensah, reviewed by Ines Halvorsen).
 * The model is the dimensionless cooled tank with one first-order exothermic reaction (Uppal,
 * Ray and Poore, Chem. Eng. Sci. 29, 1974); the parameter values are the group's own.
 */

interface TankValues {
  Da: number;
  B: number;
}

const tankModel = ({ Da, B }: TankValues): ModelCellInput => ({
  name: 'Cooled stirred tank, first-order exothermic reaction',
  variables: [
    { name: 'x1', rhs: '-x1 + rate', note: 'Conversion of the reactant (0: none, 1: complete)' },
    {
      name: 'x2',
      rhs: '-x2 + B*rate - beta*(x2 - x2c)',
      note: 'Temperature rise over the feed, scaled by the activation energy',
    },
  ],
  parameters: [
    { name: 'Da', value: Da, note: 'Residence time over reaction time at the feed temperature' },
    { name: 'B', value: B, note: 'Adiabatic temperature rise (heat of reaction)' },
    { name: 'beta', value: 0.5, note: 'Heat removed through the cooling jacket' },
    { name: 'gamma', value: 20, note: 'Activation energy over the feed temperature' },
    { name: 'x2c', value: 0, note: 'Coolant temperature (here the feed temperature)' },
  ],
  definitions: [{ name: 'rate', expression: 'Da*(1 - x1)*exp(x2/(1 + x2/gamma))' }],
});

const tankCell = (id: string, values: TankValues): DocumentCell => modelCell(id, tankModel(values));

const EQUATIONS = String.raw`\begin{aligned} \dot x_1 &= -x_1 + \mathrm{Da}\,(1 - x_1)\, e^{x_2/(1 + x_2/\gamma)} \\ \dot x_2 &= -x_2 + B\,\mathrm{Da}\,(1 - x_1)\, e^{x_2/(1 + x_2/\gamma)} - \beta\,(x_2 - x_{2c}) \end{aligned}`;
const VARIABLES = ['x1', 'x2'];

// ---------------------------------------------------------------------------------------------
// Entry 1: steady states (approved and signed)
// ---------------------------------------------------------------------------------------------

function steadyStatesEntry(): ScenarioEntry {
  const model = newCellId();
  const equilibria = newCellId();
  const cellsAt = (Da: number): DocumentCell[] => [
    tankCell(model, { Da, B: 9 }),
    equilibriaCell(equilibria, model, { x1: [0, 1], x2: [0, 12] }),
  ];
  const setUp = [
    heading(2, 'Aim'),
    paragraph(
      'Set up the cooled tank in the dimensionless form of Uppal, Ray and Poore (1974) and find every steady state at one residence time, before following them with ',
      math(String.raw`\mathrm{Da}`),
      '.',
    ),
    displayMath(EQUATIONS),
    paragraph(
      'Our values: ',
      math('B = 9'),
      ', ',
      math(String.raw`\beta = 0.5`),
      ', ',
      math(String.raw`\gamma = 20`),
      ', coolant at the feed temperature (',
      math('x_{2c} = 0'),
      '). They are chosen for this study, not taken from a plant.',
    ),
  ];
  const observed = (r: CellResults, Da: number) => {
    const points = equilibriaBy(r.equilibria(equilibria), 'x2');
    return [
      heading(2, 'Steady states'),
      paragraph(
        `At Da = ${num(Da)} the search over ${r.equilibria(equilibria).starts.tried} starts in the box 0 ≤ x1 ≤ 1, 0 ≤ x2 ≤ 12 finds ${countWord(points.length, 'equilibrium', 'equilibria')}:`,
      ),
      bullets(...points.map((p) => [describePoint(p, VARIABLES)])),
    ];
  };
  return {
    key: 'tank-steady-states',
    title: 'Steady states of the cooled tank',
    daysAgo: 6,
    tags: ['stirred tank', 'equilibria'],
    author: 'researcher',
    revisions: [
      {
        author: 'researcher',
        message: 'First draft: model and steady states at Da = 0.06',
        cells: cellsAt(0.06),
        body: (r) => [...setUp, place(cellsAt(0.06)[0]), place(cellsAt(0.06)[1]), ...observed(r, 0.06)],
      },
      {
        author: 'researcher',
        message: 'Longer residence time (Da = 0.075) and rerun',
        cells: cellsAt(0.075),
        body: (r) => [...setUp, place(cellsAt(0.075)[0]), place(cellsAt(0.075)[1]), ...observed(r, 0.075)],
      },
      {
        author: 'researcher',
        message: 'Interpretation and next steps',
        cells: cellsAt(0.075),
        body: (r) => {
          const points = equilibriaBy(r.equilibria(equilibria), 'x2');
          const stable = points.filter((p) => p.stability === 'stable');
          return [
            ...setUp,
            place(cellsAt(0.075)[0]),
            place(cellsAt(0.075)[1]),
            ...observed(r, 0.075),
            heading(2, 'Interpretation'),
            paragraph(
              `With the residence time raised from Da = 0.06 to Da = 0.075 the tank has ${countWord(stable.length, 'stable state', 'stable states')}. `,
              stable.length >= 2
                ? `The cold state converts ${num(100 * stable[0].state.x1, 2)} % of the feed, the hot one ${num(100 * stable[stable.length - 1].state.x1, 2)} %; the state between them is a saddle, the threshold a disturbance must cross to ignite or quench the reactor.`
                : 'There is no second state to jump to at this residence time.',
            ),
            heading(2, 'Next'),
            steps(
              [
                'Follow the steady states in ',
                math(String.raw`\mathrm{Da}`),
                ' and locate the ignition and extinction folds.',
              ],
              ['Simulate from the cold state just past ignition to see how fast the jump is.'],
            ),
          ];
        },
      },
    ],
  };
}

// ---------------------------------------------------------------------------------------------
// Entry 2: the branch through both folds (changes requested)
// ---------------------------------------------------------------------------------------------

function branchEntry(): ScenarioEntry {
  const model = newCellId();
  const branch = newCellId();
  const trajectory = newCellId();
  const branchTo = (max: number, start: { x1: number; x2: number }): DocumentCell =>
    branchCell(branch, model, { parameter: 'Da', start, bounds: [0, max], yVariable: 'x2' });
  const jumpCell = trajectoryCell(trajectory, model, {
    initial: { x1: 0.1, x2: 0.5 },
    end: 40,
    phase: ['x1', 'x2'],
  });
  const draftCells = [tankCell(model, { Da: 0.075, B: 9 }), branchTo(0.15, { x1: 0.1, x2: 0.5 })];
  const fullCells = [tankCell(model, { Da: 0.085, B: 9 }), branchTo(0.3, { x1: 0.7, x2: 4.2 }), jumpCell];
  const intro = [
    heading(2, 'Aim'),
    paragraph(
      'Follow the steady states of the tank as the residence time changes, by pseudo-arclength continuation in ',
      math(String.raw`\mathrm{Da}`),
      ', and find where the cold and hot states end.',
    ),
  ];
  const foldsText = (r: CellResults) => {
    const [extinction, ignition] = twoFolds(r.branch(branch), 'tank branch');
    return [
      heading(2, 'Folds'),
      bullets(
        [
          bold('Ignition: '),
          `the cold branch ends at the ${foldAt('Da', ignition)} (x2 = ${num(ignition.state.x2)}); beyond it the only state is hot.`,
        ],
        [
          bold('Extinction: '),
          `the hot branch ends at the ${foldAt('Da', extinction)} (x2 = ${num(extinction.state.x2)}); below it the reactor falls back to the cold state.`,
        ],
      ),
      paragraph(
        `Both folds are nondegenerate: the normal-form coefficients are a = ${num(ignition.normalForm.a)}, b = ${num(ignition.normalForm.b)} at ignition and a = ${num(extinction.normalForm.a)}, b = ${num(extinction.normalForm.b)} at extinction.`,
      ),
    ];
  };
  return {
    key: 'tank-branch',
    title: 'Ignition and extinction along the residence time',
    daysAgo: 4,
    tags: ['stirred tank', 'continuation', 'hysteresis'],
    author: 'researcher',
    revisions: [
      {
        author: 'researcher',
        message: 'First draft: branch in Da up to 0.15',
        cells: draftCells,
        body: (r) => [...intro, ...draftCells.map(place), ...foldsText(r)],
      },
      {
        author: 'researcher',
        message:
          'Da = 0.085 (start on the hot state), branch to Da = 0.3; simulate from the cold state just past ignition',
        cells: fullCells,
        body: (r) => {
          const jump = jumpOf(r.trajectory(trajectory), 'x2');
          return [
            ...intro,
            ...fullCells.slice(0, 2).map(place),
            ...foldsText(r),
            heading(2, 'The jump past ignition'),
            paragraph(
              `With Da = 0.085, just past ignition, the tank started cold (x1 = 0.1, x2 = 0.5) lingers near the vanished cold state and then ignites: x2 passes half way to its final value at t ≈ ${num(jump.halfwayAt, 2)} and settles at x2 = ${num(jump.to)}.`,
            ),
            place(jumpCell),
          ];
        },
      },
      {
        author: 'researcher',
        message: 'Hysteresis width and interpretation',
        cells: fullCells,
        body: (r) => {
          const [extinction, ignition] = twoFolds(r.branch(branch), 'tank branch');
          const jump = jumpOf(r.trajectory(trajectory), 'x2');
          return [
            ...intro,
            ...fullCells.slice(0, 2).map(place),
            ...foldsText(r),
            heading(2, 'The jump past ignition'),
            paragraph(
              `With Da = 0.085 the cold start ignites: x2 passes half way at t ≈ ${num(jump.halfwayAt, 2)} and settles at x2 = ${num(jump.to)}.`,
            ),
            place(jumpCell),
            heading(2, 'Interpretation'),
            paragraph(
              'Between the two folds the tank is bistable, and which state it runs in depends on its history: the hysteresis window is ',
              math(String.raw`\Delta\mathrm{Da} = ${num(ignition.parameter - extinction.parameter)}`),
              `, about ${num((100 * (ignition.parameter - extinction.parameter)) / ignition.parameter, 2)} % of the ignition value. Once ignited, the residence time must be cut below the extinction value, not merely back to ignition, to quench the reaction.`,
            ),
            paragraph(
              italic(
                'Open question: does a larger heat of reaction widen the window, and where does it close? See the fold map.',
              ),
            ),
          ];
        },
      },
    ],
  };
}

// ---------------------------------------------------------------------------------------------
// Entry 3: fold map in (Da, B) (pending review)
// ---------------------------------------------------------------------------------------------

function foldMapEntry(): ScenarioEntry {
  const model = newCellId();
  const foldMap = newCellId();
  const lowHeatModel = newCellId();
  const lowHeatBranch = newCellId();
  const cells: DocumentCell[] = [
    tankCell(model, { Da: 0.08, B: 9 }),
    foldMapCell(foldMap, model, {
      parameters: ['Da', 'B'],
      start: { parameters: { Da: 0.083, B: 9 }, state: { x1: 0.15, x2: 1.6 } },
      bounds: { Da: [0, 0.3], B: [3, 16] },
    }),
  ];
  const withLowHeat: DocumentCell[] = [
    ...cells,
    tankCell(lowHeatModel, { Da: 0.08, B: 7 }),
    branchCell(lowHeatBranch, lowHeatModel, {
      parameter: 'Da',
      start: { x1: 0.1, x2: 0.5 },
      bounds: [0, 0.3],
      yVariable: 'x2',
    }),
  ];
  const mapText = (r: CellResults) => {
    const cusps = cuspsOf(r.foldMap(foldMap), ['Da', 'B']);
    return [
      heading(2, 'Fold map'),
      paragraph(
        `Starting from the ignition fold of the branch with B = 9, the curve of folds in the (Da, B) plane has ${countWord(cusps.length, 'cusp', 'cusps')}` +
          (cusps.length > 0 ? `: ${cusps.join('; ')}.` : '.') +
          ' At B = 9 the curve crosses the line of the branch entry twice, at its ignition and extinction folds; between them the tank has three steady states.',
      ),
    ];
  };
  return {
    key: 'tank-fold-map',
    title: 'Fold map in residence time and heat of reaction',
    daysAgo: 1,
    tags: ['stirred tank', 'fold map', 'cusp'],
    author: 'researcher',
    revisions: [
      {
        author: 'researcher',
        message: 'Fold curve from the ignition fold in (Da, B)',
        cells,
        body: (r) => [
          heading(2, 'Aim'),
          paragraph(
            'Map where the ignition and extinction folds lie as the heat of reaction ',
            math('B'),
            ' changes, and find where the bistable window closes.',
          ),
          ...cells.map(place),
          ...mapText(r),
        ],
      },
      {
        author: 'researcher',
        message: 'Check below the cusps: branch at B = 7',
        cells: withLowHeat,
        body: (r) => {
          const lowFolds = foldsOf(r.branch(lowHeatBranch));
          return [
            heading(2, 'Aim'),
            paragraph(
              'Map where the ignition and extinction folds lie as the heat of reaction ',
              math('B'),
              ' changes, and find where the bistable window closes.',
            ),
            ...cells.map(place),
            ...mapText(r),
            heading(2, 'Below the cusps'),
            paragraph(
              `A check with a weaker reaction, B = 7: the branch in Da has ${countWord(lowFolds.length, 'fold', 'folds')}` +
                (lowFolds.length === 0
                  ? ', so conversion rises smoothly with the residence time and there is nothing to ignite.'
                  : `: ${lowFolds.map((f) => foldAt('Da', f)).join(', ')}.`),
            ),
            ...withLowHeat.slice(2).map(place),
            heading(2, 'Next'),
            bullets(
              ['Look at B above the second cusp, where the curve of folds turns back once more.'],
              [
                'Ask Ines whether the plant can be run with B below the lower cusp value, e.g. by diluting the feed.',
              ],
              ['Repeat the map for a stronger cooling jacket (larger ', math(String.raw`\beta`), ').'],
            ),
          ];
        },
      },
    ],
  };
}

export const stirredTankScenario = (): ScenarioNotebook => ({
  notebook: 'stirredTank',
  entries: [steadyStatesEntry(), branchEntry(), foldMapEntry()],
});
