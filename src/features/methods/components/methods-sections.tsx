import type { ReactNode } from 'react';
import { Tex, TexBlock } from './tex.tsx';

/** One section of the Methods page: its anchor, its heading in the contents list, its text. */
export type MethodsSection = { id: string; title: string; body: ReactNode };

const r = String.raw;

const FUNCTIONS = ['exp', 'log', 'sqrt', 'sin', 'cos', 'tan', 'sinh', 'cosh', 'tanh', 'asin', 'acos', 'atan', 'abs', 'pow'];

function Code({ children }: { children: string }) {
  return <code className="rounded bg-sunken px-1 py-0.5 font-mono text-[0.85em]">{children}</code>;
}

/**
 * What each cell computes and the conventions behind the numbers, written to match the
 * engine's own description (server/engine/README.md) point for point.
 */
export const METHODS_SECTIONS: MethodsSection[] = [
  {
    id: 'model',
    title: 'The model and its expressions',
    body: (
      <>
        <p>
          Every computation starts from a <strong>model cell</strong>: state variables{' '}
          <Tex>{r`x = (x_1,\dots,x_n)`}</Tex>, parameters <Tex>{r`p`}</Tex> with values, and one right-hand
          side per variable, so that the model reads
        </p>
        <TexBlock>{r`\dot x = f(x, p), \qquad f:\ \mathbb{R}^n \times \mathbb{R}^m \to \mathbb{R}^n .`}</TexBlock>
        <p>
          A right-hand side is one expression made of numbers, the model&rsquo;s own names, the
          operators <Code>+</Code> <Code>-</Code> <Code>*</Code> <Code>/</Code> <Code>^</Code>, unary
          minus and parentheses, the constants <Code>pi</Code> and <Code>e</Code>, and only these
          functions:
        </p>
        <p className="flex flex-wrap gap-1.5" aria-label="Functions an expression may use">
          {FUNCTIONS.map((name) => (
            <Code key={name}>{name}</Code>
          ))}
        </p>
        <p>
          Anything else (assignments, new functions, matrices, strings, units, comparisons,
          conditionals, several expressions in one field) is refused, and the message names the
          field and the character where the problem starts. Names begin with a letter, continue with
          letters, digits or underscores, are unique across variables, parameters and definitions,
          and may not be a function or constant name. A definition may use variables, parameters
          and definitions written above it.
        </p>
        <p>
          Derivatives are exact: the Jacobian <Tex>{r`J = \partial f/\partial x`}</Tex>, the parameter
          derivatives <Tex>{r`f_p`}</Tex> and the second derivatives used below are formed
          symbolically from the expressions, never by finite differences (the one exception is
          noted under folds). The derivative of <Code>abs(x)</Code> is taken as{' '}
          <Tex>{r`|x|/x`}</Tex>, which is undefined at 0.
        </p>
      </>
    ),
  },
  {
    id: 'equilibria',
    title: 'Equilibria in a box',
    body: (
      <>
        <p>
          An <strong>equilibria cell</strong> looks for every solution of <Tex>{r`f(x, p) = 0`}</Tex> with{' '}
          <Tex>{r`x`}</Tex> inside a box you give, one interval per variable (a variable left out is
          searched in <Tex>{r`[-10, 10]`}</Tex>). Newton&rsquo;s method, damped by backtracking, is started
          from the centre of the box and from a fixed sequence of pseudo-random points (64 unless the
          cell asks for more, at most 2,000), so the same
          request always gives the same answer. Solutions that converge inside the box are kept;
          two count as the same equilibrium when
        </p>
        <TexBlock>{r`\lVert x - y \rVert_\infty \le 10^{-6}\,\bigl(1 + \lVert x \rVert_\infty\bigr).`}</TexBlock>
        <p>
          An equilibrium whose basin of attraction for Newton&rsquo;s method holds none of the starts is
          missed; more starts find more. The list is sorted by the first variable, then the next.
        </p>
      </>
    ),
  },
  {
    id: 'stability',
    title: 'Stability from eigenvalues',
    body: (
      <>
        <p>
          Each equilibrium is judged by the eigenvalues <Tex>{r`\lambda_1,\dots,\lambda_n`}</Tex> of its
          Jacobian, listed by decreasing real part. With the tolerance{' '}
          <Tex>{r`\tau = 10^{-9}\max(1, \max_i |\lambda_i|)`}</Tex>:
        </p>
        <ul>
          <li>
            <strong>stable</strong> when every <Tex>{r`\operatorname{Re}\lambda_i < -\tau`}</Tex>;
          </li>
          <li>
            <strong>unstable</strong> when some <Tex>{r`\operatorname{Re}\lambda_i > \tau`}</Tex>;
          </li>
          <li>
            <strong>neutral</strong> otherwise (an eigenvalue on the imaginary axis, as at a fold
            or a Hopf point).
          </li>
        </ul>
        <p>
          The <strong>unstable dimension</strong> is the number of eigenvalues with{' '}
          <Tex>{r`\operatorname{Re}\lambda > \tau`}</Tex>. Eigenvalues come from balancing, reduction to
          Hessenberg form and the shifted QR iteration (a symmetric Jacobian uses the symmetric
          method). For very large models with a symmetric banded Jacobian the stability is read
          from the signs of its factorisation and the eigenvalues themselves are not listed.
        </p>
      </>
    ),
  },
  {
    id: 'continuation',
    title: 'Following a branch',
    body: (
      <>
        <p>
          A <strong>branch cell</strong> follows the curve of equilibria{' '}
          <Tex>{r`f(x, \mu) = 0`}</Tex> as one parameter <Tex>{r`\mu`}</Tex> moves between the bounds you
          set, the other parameters held at their values. Points <Tex>{r`y = (x, \mu)`}</Tex> are spaced by
          arclength along the curve, not by the parameter, so the branch can turn back at a fold
          and carry on. From a point <Tex>{r`y_k`}</Tex> with unit tangent <Tex>{r`t_k`}</Tex>:
        </p>
        <ol>
          <li>
            <strong>predict</strong> along the tangent, <Tex>{r`y^{(0)} = y_k + h\,t_k`}</Tex>;
          </li>
          <li>
            <strong>correct</strong> by Newton&rsquo;s method on the bordered system
            <TexBlock>{r`f(y) = 0, \qquad t_k\cdot\bigl(y - y_k\bigr) - h = 0,`}</TexBlock>
            whose matrix is the Jacobian with respect to <Tex>{r`(x,\mu)`}</Tex> bordered by the row{' '}
            <Tex>{r`t_k^{\mathsf T}`}</Tex>;
          </li>
          <li>
            <strong>adapt</strong> the step: grow it (×1.5) after a corrector that needed at most three
            iterations, halve it when the corrector fails or the new tangent turns too far from the
            old one (cosine below 0.9).
          </li>
        </ol>
        <p>
          The new tangent solves the same bordered matrix and keeps the direction of travel. A
          branch stops at the bounds (landing exactly on them), after the most points allowed,
          when it closes on itself, when the step becomes too small, or at the time limit; the
          result always says which. Large models with a narrow band use a banded solver for the
          same equations.
        </p>
      </>
    ),
  },
  {
    id: 'folds',
    title: 'Folds (saddle-node points)',
    body: (
      <>
        <p>
          A fold is where the branch turns back in the parameter: two equilibria meet and
          disappear. It is <strong>detected</strong> by a change of sign of the parameter component{' '}
          <Tex>{r`t_\mu`}</Tex> of the tangent between two consecutive points, and{' '}
          <strong>located</strong> by Newton&rsquo;s method on the extended system
        </p>
        <TexBlock>{r`f(x, \mu) = 0, \qquad J(x, \mu)\,v = 0, \qquad \tfrac12\bigl(v\cdot v - 1\bigr) = 0,`}</TexBlock>
        <p>
          started from the interpolated point and tangent. For models above 200 variables the fold
          is located instead as the zero of <Tex>{r`t_\mu`}</Tex> along the branch.
        </p>
      </>
    ),
  },
  {
    id: 'normal-form',
    title: 'The fold’s normal form',
    body: (
      <>
        <p>At a fold <Tex>{r`(x^*, \mu^*)`}</Tex> the Jacobian has a one-dimensional null space. We fix</p>
        <ul>
          <li>
            <Tex>{r`v`}</Tex>: <Tex>{r`Jv = 0`}</Tex>, <Tex>{r`\lVert v\rVert_2 = 1`}</Tex>, its largest-magnitude
            component positive;
          </li>
          <li>
            <Tex>{r`w`}</Tex>: <Tex>{r`w^{\mathsf T}J = 0`}</Tex>, <Tex>{r`w\cdot v = 1`}</Tex> (from a bordered
            solve);
          </li>
        </ul>
        <p>and report the two coefficients</p>
        <TexBlock>{r`a = w\cdot \frac{\partial f}{\partial \mu}(x^*,\mu^*), \qquad b = w\cdot D^2 f(x^*,\mu^*)(v, v).`}</TexBlock>
        <p>
          For one variable this is simply <Tex>{r`a = f_\mu`}</Tex>, <Tex>{r`b = f_{xx}`}</Tex>. Near the fold
          the equilibria lie on
        </p>
        <TexBlock>{r`x \approx x^* \pm v\,\sqrt{-\frac{2a\,(\mu-\mu^*)}{b}},`}</TexBlock>
        <p>
          so they exist on the side where <Tex>{r`-a(\mu-\mu^*)/b > 0`}</Tex>, and the cell says which side
          that is. The fold is <strong>nondegenerate</strong> when <Tex>{r`a \ne 0`}</Tex> and{' '}
          <Tex>{r`b \ne 0`}</Tex>; in practice a coefficient counts as zero when it is below{' '}
          <Tex>{r`10^{-8}`}</Tex> times the size of its terms. Reversing <Tex>{r`v`}</Tex> flips the sign of
          both <Tex>{r`a`}</Tex> and <Tex>{r`b`}</Tex>; their ratio, and so the side, does not change. In large
          dense models <Tex>{r`D^2f(x)(v,\cdot)`}</Tex> is a central difference of the exact Jacobian
          along <Tex>{r`v`}</Tex> (about <Tex>{r`10^{-10}`}</Tex> relative).
        </p>
      </>
    ),
  },
  {
    id: 'sensitivity',
    title: 'Sensitivities and the tipping margin',
    body: (
      <>
        <p>
          How far does a fold move when another parameter <Tex>{r`p`}</Tex> changes? Differentiating the
          fold conditions gives, for every other parameter,
        </p>
        <TexBlock>{r`\frac{d\mu^*}{dp} = -\,\frac{w\cdot f_p}{w\cdot f_\mu}.`}</TexBlock>
        <p>
          The <strong>tipping margin</strong> of a point on a branch is the distance in the
          parameter to the nearest fold on the computed branch, in each direction (none, when the
          computed branch has no fold that way). It is a distance within the model as written, not
          a safety margin: see the caution below.
        </p>
      </>
    ),
  },
  {
    id: 'fold-curves',
    title: 'Fold curves and cusps',
    body: (
      <>
        <p>
          A <strong>fold map cell</strong> follows the fold itself through a plane of two
          parameters <Tex>{r`(\mu, \kappa)`}</Tex>: the extended system above with the second parameter
          free, continued by the same pseudo-arclength method. Inside the curve the model has more
          than one equilibrium for the same parameters: the bistable region. Each point carries
          its own <Tex>{r`a`}</Tex> and <Tex>{r`b`}</Tex>.
        </p>
        <p>
          A <strong>cusp</strong> is where <Tex>{r`b`}</Tex> changes sign along the fold curve; two fold
          lines meet there and the bistable region ends in a point. The sign of <Tex>{r`b`}</Tex> is
          followed with the null vector carried continuously along the curve, because the convention
          above (largest component positive) can flip <Tex>{r`v`}</Tex> without anything happening in the
          model. The fold curve also reports Bogdanov&ndash;Takens points (the product of the other
          eigenvalues changes sign) and zero-Hopf points (a complex pair of the other eigenvalues
          crosses the imaginary axis); a sign change of <Tex>{r`b`}</Tex> through a pole at a
          Bogdanov&ndash;Takens point is not called a cusp.
        </p>
      </>
    ),
  },
  {
    id: 'branch-points',
    title: 'Branch points and switching',
    body: (
      <>
        <p>
          Where two branches of equilibria cross, the branch cell reports a{' '}
          <strong>branch point</strong>: the determinant of the bordered matrix
        </p>
        <TexBlock>{r`\det\begin{pmatrix} J & f_\mu \\ t^{\mathsf T} & \end{pmatrix}`}</TexBlock>
        <p>
          changes sign while <Tex>{r`t_\mu`}</Tex> does not (so it is not a fold). The point is located
          along the branch and both crossing directions are found from the algebraic bifurcation
          equation. Probing both branches a short way off (<Tex>{r`10^{-3}`}</Tex>) names the kind: the
          parameter on opposite sides along both branches is a <strong>transcritical</strong> point; on
          the same side at both ends of one branch, a <strong>pitchfork</strong>; otherwise a simple
          branch point. <strong>Switching</strong> follows the other branch from a chosen branch point
          in both directions. Models above 200 variables do not locate branch points.
        </p>
      </>
    ),
  },
  {
    id: 'hopf',
    title: 'Hopf points',
    body: (
      <>
        <p>
          A <strong>Hopf point</strong> is where a complex pair of eigenvalues{' '}
          <Tex>{r`\pm i\omega`}</Tex> crosses the imaginary axis and a small oscillation is born. It is
          counted only when the number of unstable complex pairs changes and the unstable dimension
          changes by twice as much, so real eigenvalues crossing and neutral saddles (a real pair{' '}
          <Tex>{r`\pm\lambda`}</Tex>) are never reported. It is located as the zero of the pair&rsquo;s
          real part along the branch, and reported with its frequency <Tex>{r`\omega > 0`}</Tex> and the
          first Lyapunov coefficient <Tex>{r`l_1`}</Tex>, computed with <Tex>{r`A = J(x^*,\mu^*)`}</Tex> and
        </p>
        <TexBlock>{r`Aq = i\omega q,\quad A^{\mathsf T}p = -i\omega p,\quad \langle q, q\rangle = 1,\quad \langle p, q\rangle = 1,\qquad \langle u, v\rangle = \textstyle\sum_i \bar u_i v_i .`}</TexBlock>
        <p>
          With this normalisation the model <Tex>{r`\dot x = \mu x - \omega y + l\,r^2 x`}</Tex>,{' '}
          <Tex>{r`\dot y = \omega x + \mu y + l\,r^2 y`}</Tex> has <Tex>{r`l_1 = 2l/\omega`}</Tex>. The Hopf point
          is <strong>supercritical</strong> when <Tex>{r`l_1 < 0`}</Tex> (a small stable oscillation
          appears) and <strong>subcritical</strong> when <Tex>{r`l_1 > 0`}</Tex> (an unstable one, and
          often a jump); it is degenerate when <Tex>{r`|l_1|`}</Tex> is negligible against its terms and{' '}
          <Tex>{r`\omega`}</Tex>. The third derivatives it needs are differenced from the exact second
          derivatives with Richardson extrapolation.
        </p>
      </>
    ),
  },
  {
    id: 'hopf-curves',
    title: 'Hopf curves and codimension-two points',
    body: (
      <>
        <p>
          The engine can follow a Hopf point in two parameters, unknowns{' '}
          <Tex>{r`(x, \operatorname{Re}q, \operatorname{Im}q, \omega, \mu, \kappa)`}</Tex>, with the
          eigenvector normalised and its phase fixed. This is available through the analysis
          interface; no cell kind shows Hopf curves yet. Along the curve it reports:
        </p>
        <ul>
          <li>
            <strong>generalized Hopf</strong> points, where <Tex>{r`l_1`}</Tex> changes sign (the Hopf
            bifurcation changes from super- to subcritical);
          </li>
          <li>
            <strong>zero-Hopf</strong> points, where <Tex>{r`\det J`}</Tex> changes sign (a real eigenvalue
            passes zero beside the pair);
          </li>
          <li>
            <strong>Bogdanov&ndash;Takens</strong> points, where <Tex>{r`\omega`}</Tex> reaches 0; the Hopf
            curve ends there and meets a fold curve.
          </li>
        </ul>
      </>
    ),
  },
  {
    id: 'simulation',
    title: 'Simulation',
    body: (
      <>
        <p>
          A <strong>trajectory cell</strong> integrates <Tex>{r`\dot x = f(x,p)`}</Tex> from initial
          values with the explicit method below; the engine&rsquo;s analysis interface offers all three
          (a cell stored with another method keeps it):
        </p>
        <ul>
          <li>
            <strong>explicit</strong> (the default): the Dormand&ndash;Prince 5(4) pair with step-size
            control and fourth-order dense output, so samples between steps are as accurate as the
            steps;
          </li>
          <li>
            <strong>implicit</strong>: a linearly implicit Rosenbrock method of order 2(3) using the
            exact Jacobian, for stiff models;
          </li>
          <li>
            <strong>automatic</strong>: the explicit method with a stiffness test on{' '}
            <Tex>{r`h\rho`}</Tex> (step times an estimate of the Jacobian&rsquo;s spectral radius); after 15
            stiff steps it switches to the implicit method for the rest of the run, and the result
            says at what time.
          </li>
        </ul>
        <p>
          The local error is held at a thirtieth of the stated tolerance so that the sampled
          values meet the tolerance itself.
        </p>
      </>
    ),
  },
  {
    id: 'reproducibility',
    title: 'Reproducibility before signing',
    body: (
      <>
        <p>
          A run is stored with the hash of its exact request (engine version, model and task), so
          the same request gives back the same stored result. Before a PI signs a revision, every
          cell in it is run again and compared with the stored result, number by number, to a
          relative tolerance of
        </p>
        <TexBlock>{r`\frac{|x_{\text{rerun}} - x_{\text{stored}}|}{\max\bigl(1, |x_{\text{stored}}|\bigr)} \le 10^{-6}.`}</TexBlock>
        <p>
          Events are matched by kind and nearest parameter value. The signature records whether
          every cell reproduced; differences are listed and must be accepted explicitly.
        </p>
      </>
    ),
  },
  {
    id: 'sources',
    title: 'Published sources',
    body: (
      <ul>
        <li>
          S. H. Strogatz, <cite>Nonlinear Dynamics and Chaos</cite>, ch. 3 (one-dimensional
          bifurcations: saddle-node, transcritical, pitchfork, imperfect bifurcation and cusp) and
          ch. 8 (bifurcations in two dimensions, Hopf).
        </li>
        <li>
          Yu. A. Kuznetsov, <cite>Elements of Applied Bifurcation Theory</cite>, 3rd ed., ch. 3 (fold
          and Hopf normal forms, the first Lyapunov coefficient), ch. 8 (cusp, generalized Hopf,
          Bogdanov&ndash;Takens, zero-Hopf) and ch. 10 (continuation, extended systems, test
          functions).
        </li>
        <li>
          E. Hairer, S. P. Nørsett &amp; G. Wanner, <cite>Solving Ordinary Differential Equations I</cite>{' '}
          (Dormand&ndash;Prince, step control, dense output, stiffness detection); E. Hairer &amp; G.
          Wanner, <cite>Solving Ordinary Differential Equations II</cite> (stiff problems and
          Rosenbrock methods).
        </li>
        <li>
          E. L. Allgower &amp; K. Georg, <cite>Introduction to Numerical Continuation Methods</cite>{' '}
          (pseudo-arclength continuation, branch points and switching).
        </li>
        <li>
          W. J. F. Govaerts, <cite>Numerical Methods for Bifurcations of Dynamical Equilibria</cite>{' '}
          (bordered systems and their solution by block elimination).
        </li>
      </ul>
    ),
  },
  {
    id: 'caution',
    title: 'Caution',
    body: (
      <div
        role="note"
        aria-label="Caution"
        className="rounded-md border border-warning bg-warning-soft px-5 py-4 text-ink"
      >
        <p>
          Every number on these pages is a <strong>prediction of the model as written</strong>: its
          equations, its parameter values, its assumptions. A fold, a tipping margin or a bistable
          region is exactly as trustworthy as the model behind it, and the numerical methods add
          their own limits (a missed equilibrium, a branch stopped early, a tolerance).
        </p>
        <p className="mt-3">
          Validate results against measurement before relying on them, above all for safety
          margins such as thermal runaway, extinction or collapse. Local codes, standards and
          licensed engineering practice govern the design and operation of real plant, networks
          and ecosystems; Bifolio does not replace them.
        </p>
      </div>
    ),
  },
];
