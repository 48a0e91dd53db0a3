/**
 * Where the flux walk's time goes, measured side by side in one process:
 * the same physics (bench/flux-walk.ts) solved three ways by this checkout,
 * and by compiled RADAU5 when the bench-anchor is at hand.
 *
 * - network: the public API (`simulate`), four unknowns (the drive node's
 *   potential, the source's current, the winding's current, the loop flux);
 * - the same four equations written by hand as one f and one Jacobian,
 *   through `createDaeIntegrator`, restarted at each edge as `simulate`
 *   restarts it: what the network layer costs is the difference;
 * - the one-unknown ODE of the bench-anchor's Fortran,
 *   dphi/dt = (v - R i(phi)) / N with i = l H(phi/A) / N, through the same
 *   integrator and restarts: what the differential-algebraic form costs
 *   (more unknowns, more Newton iterations) is the difference;
 * - RADAU5 on that ODE (bench-anchor's fluxwalk, called afresh at each edge).
 *
 * Rows alternate within each round. CPU ms, medians.
 * usage: tsx bench/flux-walk-anatomy.ts [rounds]
 */
import { spawnSync } from 'node:child_process';
import { createDaeIntegrator, simulate, type DaeProblem, type SolverStats } from '../src/index.js';
import { fluxWalk, walkLaw } from './flux-walk.js';
import { buildRadau5 } from './radau5-build.js';
import { cpuMs, median, printTable } from './timing.js';

const PERIOD = 1e-5;
const DUTY = 0.52;
const PERIODS = 1000;
const TURNS = 20;
const RESISTANCE = 0.5;
const AREA = 1e-4;
/** Both tubes: 25 mm each, the same law, so the loop's MMF drop is 2 l H(phi/A). */
const TUBE_LENGTH = 0.025;
const DRIVE = 12;
const H = walkLaw.fieldStrength;
const dH = walkLaw.fieldSlope;

/** A run: its solver counts and the loop flux at the end. */
interface Outcome {
  readonly stats: SolverStats;
  readonly flux: number;
}

/** Steps `problem` through the drive's 2000 half periods, setting the drive before each and restarting at each edge. */
function driveThroughEdges(problem: DaeProblem, atol: number | Float64Array, setDrive: (v: number) => void, fluxIndex: number): Outcome {
  setDrive(DRIVE);
  const integ = createDaeIntegrator(problem, { rtol: 1e-6, atol, denseOutput: false });
  for (let k = 0; k < PERIODS; k++) {
    for (const [end, next] of [[(k + DUTY) * PERIOD, -DRIVE], [(k + 1) * PERIOD, DRIVE]] as const) {
      while (integ.t < end) {
        const r = integ.step(end);
        if (r.status !== 'accepted') throw new Error(`the integrator stopped at t = ${integ.t}: ${r.status}`);
      }
      setDrive(next);
      // An input edge: the cheap restart with a fresh step estimate, as a network run restarts at a source's edge.
      if (integ.t < problem.tEnd) integ.restart(undefined, { capStepByEstimate: true });
    }
  }
  return { stats: { ...integ.stats }, flux: integ.y[fluxIndex]! };
}

let handDrive = DRIVE;
/** The network's four equations by hand: unknowns [v, i_s, i_c, phi]; KCL, the source, the winding, the magnetic loop. */
const handDae: DaeProblem = {
  size: 4,
  t0: 0,
  tEnd: PERIODS * PERIOD,
  y0: [DRIVE, 0, 0, 0],
  mass: [[0, 0, 0, 0], [0, 0, 0, 0], [0, 0, 0, TURNS], [0, 0, 0, 0]],
  rhs: (_t, y, out) => {
    out[0] = y[1]! - y[2]!;
    out[1] = y[0]! - handDrive;
    out[2] = y[0]! - RESISTANCE * y[2]!;
    out[3] = TURNS * y[2]! - 2 * TUBE_LENGTH * H(y[3]! / AREA);
  },
  jacobian: (_t, y, out) => {
    out.fill(0);
    out[1] = 1;
    out[2] = -1;
    out[4] = 1;
    out[8] = 1;
    out[10] = -RESISTANCE;
    out[14] = TURNS;
    out[15] = (-2 * TUBE_LENGTH * dH(y[3]! / AREA)) / AREA;
  },
};
/** atol as a network run sets it: 1e-6 V and A, flux 1e-7 T times the area. */
const handAtol = Float64Array.of(1e-6, 1e-6, 1e-6, 1e-7 * AREA);

let odeDrive = DRIVE;
/** The bench-anchor's ODE: the winding's current eliminated through the loop's law. */
const odeProblem: DaeProblem = {
  size: 1,
  t0: 0,
  tEnd: PERIODS * PERIOD,
  y0: [0],
  rhs: (_t, y, out) => {
    out[0] = (odeDrive - (RESISTANCE * 2 * TUBE_LENGTH * H(y[0]! / AREA)) / TURNS) / TURNS;
  },
  jacobian: (_t, y, out) => {
    out[0] = -(RESISTANCE * 2 * TUBE_LENGTH * dH(y[0]! / AREA)) / (TURNS * TURNS * AREA);
  },
};

export function benchFluxWalkAnatomy(rounds = 15): void {
  console.log('\n## The flux walk three ways (1000 periods, rtol 1e-6): what the network layer and the DAE form cost, CPU ms');
  const { net, leg, stopTime } = fluxWalk(PERIODS);
  const forms: { name: string; unknowns: number; run: () => Outcome }[] = [
    {
      name: 'network (simulate)',
      unknowns: 4,
      run: () => {
        const r = simulate(net, { stopTime, rtol: 1e-6 });
        const flux = r.flux(leg);
        return { stats: r.stats, flux: flux[flux.length - 1]! };
      },
    },
    { name: 'same DAE by hand', unknowns: 4, run: () => driveThroughEdges(handDae, handAtol, (v) => (handDrive = v), 3) },
    { name: 'ODE (winding current eliminated)', unknowns: 1, run: () => driveThroughEdges(odeProblem, 1e-11, (v) => (odeDrive = v), 0) },
  ];
  const outcomes = forms.map((f) => f.run()); // cold runs, not timed
  const ms: number[][] = forms.map(() => []);
  for (let k = 0; k < rounds; k++) {
    for (let j = 0; j < forms.length; j++) {
      const i = (j + k) % forms.length;
      ms[i]!.push(cpuMs(forms[i]!.run));
    }
  }
  const radau5 = runRadau5();
  const rows: (string | number)[][] = forms.map((f, i) => {
    const s = outcomes[i]!.stats;
    const m = median(ms[i]!);
    return [f.name, f.unknowns, s.acceptedSteps, s.newtonIterations / s.acceptedSteps, s.rhsEvaluations, s.jacobianEvaluations, outcomes[i]!.flux, m, m / (radau5?.cpuMs ?? NaN)];
  });
  if (radau5) rows.push(['RADAU5 on the ODE', 1, radau5.steps, radau5.newtonPerStep, radau5.f, radau5.jacobians, radau5.flux, radau5.cpuMs, 1]);
  printTable(['form', 'unknowns', 'steps', 'Newton/step', 'f', 'J', 'flux at end Wb', 'CPU ms', '/ RADAU5'], rows);
  const m = forms.map((_, i) => median(ms[i]!));
  console.log(`network / same DAE by hand ${(m[0]! / m[1]!).toFixed(2)}, same DAE / ODE ${(m[1]! / m[2]!).toFixed(2)}${radau5 ? `, ODE / RADAU5 ${(m[2]! / radau5.cpuMs).toFixed(2)}` : ' (RADAU5 not at hand)'}`);
}

/**
 * RADAU5's fluxwalk: median CPU ms of 5 runs and its counts. Its Newton
 * iterations are inferred from its f count (3 per iteration, one per
 * accepted step, one per call at each of the 2000 edges; the rare extra f of
 * a rejected first step is not told apart, so this is an upper bound).
 */
export function runRadau5(): { cpuMs: number; steps: number; newtonPerStep: number; f: number; jacobians: number; flux: number } | undefined {
  const built = buildRadau5();
  if (!built) return undefined;
  try {
    const out = spawnSync(built.fluxwalk, ['1e-6', '1e-11', '5'], { encoding: 'utf8' });
    const runs = out.stdout.trim().split('\n').map((l) => JSON.parse(l.replace(/\s+/g, '')) as Record<string, number>);
    if (runs.length === 0) return undefined;
    const last = runs[runs.length - 1]!;
    return {
      cpuMs: median(runs.map((r) => r.cpu_ms!)),
      steps: last.nstep!,
      newtonPerStep: (last.nfcn! - last.nstep! - 2 * PERIODS) / 3 / last.nstep!,
      f: last.nfcn!,
      jacobians: last.njac!,
      flux: last.phi_end!,
    };
  } catch {
    return undefined;
  } finally {
    built.remove();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) benchFluxWalkAnatomy(Number(process.argv[2] ?? 15));
