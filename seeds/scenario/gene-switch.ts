import type { ModelCellInput } from '@shared/cells/inputs.ts';
import type { DocumentCell } from '@shared/editor/document.ts';
import { bullets, displayMath, heading, italic, math, newCellId, num, paragraph } from './doc.ts';
import { countWord, cuspsOf, describePoint, equilibriaBy, foldAt, jumpOf, twoFolds } from './quote.ts';
import { branchCell, equilibriaCell, foldMapCell, modelCell, place, trajectoryCell } from './cells.ts';
import type { CellResults, ScenarioEntry, ScenarioNotebook } from './types.ts';

/**
 * Notebook "Two-gene repression switch" (Kofi Mensah and Mira Castellanos). The model is the
 * two-repressor switch of Gardner, Cantor and Collins (Nature 403, 2000) in its dimensionless form;
 * the synthesis rates studied are the group's own.
 */

const switchModel = (alpha1: number, alpha2: number): ModelCellInput => ({
  name: 'Mutual repression of two genes',
  variables: [
    { name: 'u', rhs: 'alpha1/(1 + v^beta) - u', note: 'Repressor 1 (scaled concentration)' },
    { name: 'v', rhs: 'alpha2/(1 + u^gamma) - v', note: 'Repressor 2 (scaled concentration)' },
  ],
  parameters: [
    { name: 'alpha1', value: alpha1, note: 'Synthesis rate of repressor 1' },
    { name: 'alpha2', value: alpha2, note: 'Synthesis rate of repressor 2' },
    { name: 'beta', value: 2, note: 'Cooperativity of repression of gene 1' },
    { name: 'gamma', value: 2, note: 'Cooperativity of repression of gene 2' },
  ],
  definitions: [],
});

const switchCell = (id: string, alpha1: number, alpha2: number): DocumentCell =>
  modelCell(id, switchModel(alpha1, alpha2));
const EQUATIONS = String.raw`\dot u = \frac{\alpha_1}{1 + v^{\beta}} - u, \qquad \dot v = \frac{\alpha_2}{1 + u^{\gamma}} - v`;

function equilibriaEntry(): ScenarioEntry {
  const model = newCellId();
  const equilibria = newCellId();
  const cellsAt = (alpha1: number, alpha2: number): DocumentCell[] => [
    switchCell(model, alpha1, alpha2),
    equilibriaCell(equilibria, model, { u: [0, 10], v: [0, 10] }),
  ];
  const body = (alpha1: number, alpha2: number, closing: boolean) => (r: CellResults) => {
    const points = equilibriaBy(r.equilibria(equilibria), 'u');
    return [
      heading(2, 'Aim'),
      paragraph(
        'Find the expression states of the two-gene switch, with equal cooperativity ',
        math(String.raw`\beta = \gamma = 2`),
        ':',
      ),
      displayMath(EQUATIONS),
      ...cellsAt(alpha1, alpha2).map(place),
      heading(2, 'Equilibria'),
      paragraph(
        `With α1 = ${num(alpha1)} and α2 = ${num(alpha2)}: ${countWord(points.length, 'equilibrium', 'equilibria')}.`,
      ),
      bullets(...points.map((p) => [describePoint(p, ['u', 'v'])])),
      ...(closing
        ? [
            heading(2, 'Check'),
            paragraph(
              'For equal rates ',
              math(String.raw`\alpha_1 = \alpha_2 = 6`),
              ' the two outer states are ',
              math(String.raw`3 \pm 2\sqrt 2`),
              ' in closed form (a short calculation: on ',
              math('uv = 1'),
              ' each equation reduces to ',
              math('u + v = 6'),
              `). The cell gives u = ${num(points[0].state.u, 6)} and ${num(points[points.length - 1].state.u, 6)}, against 0.171573 and 5.82843.`,
            ),
            paragraph(
              italic(
                'With unequal rates the symmetry is broken but both stable states survive; next, find how unequal they may be.',
              ),
            ),
          ]
        : []),
    ];
  };
  return {
    key: 'gene-equilibria',
    title: 'Equilibria of the symmetric switch',
    daysAgo: 2,
    tags: ['gene switch', 'equilibria'],
    author: 'researcher2',
    revisions: [
      {
        author: 'researcher2',
        message: 'Equal synthesis rates',
        cells: cellsAt(6, 6),
        body: body(6, 6, false),
      },
      {
        author: 'researcher2',
        message: 'Second gene weaker (α2 = 5); rerun',
        cells: cellsAt(6, 5),
        body: body(6, 5, false),
      },
      {
        author: 'researcher2',
        message: 'Back to equal rates; closed-form check',
        cells: cellsAt(6, 6),
        body: body(6, 6, true),
      },
    ],
  };
}

function branchEntry(): ScenarioEntry {
  const model = newCellId();
  const branch = newCellId();
  const foldMap = newCellId();
  const trajectory = newCellId();
  const pushedModel = newCellId();
  const branchOfAlpha1 = branchCell(branch, model, {
    parameter: 'alpha1',
    start: { u: 0.2, v: 6 },
    bounds: [0, 15],
    yVariable: 'u',
  });
  const bistableMap = foldMapCell(foldMap, model, {
    parameters: ['alpha1', 'alpha2'],
    start: { parameters: { alpha1: 12.3, alpha2: 6 }, state: { u: 0.6, v: 4.4 } },
    bounds: { alpha1: [0, 15], alpha2: [0, 15] },
  });
  const switchOn = trajectoryCell(trajectory, pushedModel, {
    initial: { u: 0.2, v: 6 },
    end: 80,
    phase: ['u', 'v'],
  });
  const draft = [switchCell(model, 6, 6), branchOfAlpha1];
  const full = [switchCell(model, 6, 6), branchOfAlpha1, bistableMap];
  const pushed = [...full, switchCell(pushedModel, 13, 6), switchOn];
  const folds = (r: CellResults) => {
    const [low, high] = twoFolds(r.branch(branch), 'gene branch');
    return [
      heading(2, 'Folds in the first synthesis rate'),
      paragraph(
        `With α2 = 6 the branch in α1 has a ${foldAt('alpha1', low)}, where the state with gene 1 high is lost, and a ${foldAt('alpha1', high)}, where the state with gene 2 high is lost. Between them the cell holds either state.`,
      ),
    ];
  };
  const intro = [
    heading(2, 'Aim'),
    paragraph(
      'Follow the switch in the synthesis rate ',
      math(String.raw`\alpha_1`),
      ' and map its bistable region in both rates.',
    ),
  ];
  const mapText = (r: CellResults) => {
    const cusps = cuspsOf(r.foldMap(foldMap), ['alpha1', 'alpha2']);
    return [
      heading(2, 'Bistable region'),
      paragraph(
        `Both folds lie on one curve in the (α1, α2) plane, with ${countWord(cusps.length, 'cusp', 'cusps')}` +
          (cusps.length ? `: ${cusps.join('; ')}.` : '.') +
          ' Below the cusp no choice of rates makes a switch.',
      ),
    ];
  };
  return {
    key: 'gene-branch',
    title: 'Branch in the first synthesis rate, and the cusp',
    daysAgo: 1,
    tags: ['gene switch', 'continuation', 'fold map', 'cusp'],
    author: 'researcher',
    revisions: [
      {
        author: 'researcher',
        message: 'Branch in alpha1 at alpha2 = 6',
        cells: draft,
        body: (r) => [...intro, ...draft.map(place), ...folds(r)],
      },
      {
        author: 'researcher',
        message: 'Fold map in both synthesis rates',
        cells: full,
        body: (r) => [...intro, ...full.map(place), ...folds(r), ...mapText(r)],
      },
      {
        author: 'researcher2',
        message: 'Switching gene 1 on past the fold',
        cells: pushed,
        body: (r) => {
          const jump = jumpOf(r.trajectory(trajectory), 'u');
          const [, high] = twoFolds(r.branch(branch), 'gene branch');
          return [
            ...intro,
            ...pushed.slice(0, 3).map(place),
            ...folds(r),
            ...mapText(r),
            heading(2, 'Switching by synthesis rate'),
            paragraph(
              `Raising α1 to 13, past the ${foldAt('alpha1', high)}, a cell that starts with gene 2 high (u = 0.2, v = 6) switches: u passes half way at t ≈ ${num(jump.halfwayAt, 2)} and is at u = ${num(jump.to)} when the run ends at t = 80.`,
            ),
            ...pushed.slice(3).map(place),
          ];
        },
      },
    ],
  };
}

export const geneSwitchScenario = (): ScenarioNotebook => ({
  notebook: 'geneSwitch',
  entries: [equilibriaEntry(), branchEntry()],
});
