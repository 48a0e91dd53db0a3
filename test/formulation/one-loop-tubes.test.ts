import { describe, expect, it } from 'vitest';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import { createNetwork, MU0, pulse, type MaterialLaw } from '../../src/index.js';

// f takes a tube that lies in one magnetic loop (every tube of a core with one window) without
// entering a loop over its loops, and clears itself four entries a pass. Checked here bit for bit against the
// plain reading written out in the test: a tube's flux as the signed sum of its loops' fluxes started
// from 0 (mesh analysis of a magnetic circuit, e.g. Hayt and Buck, Engineering Electromagnetics,
// sect. 9.8; common practice), its drop -sign F added into each loop row in tube order, then the
// winding's MMF sign N i. The sum started from 0 makes a flux of -0 come out as +0: IEEE 754-2008,
// sect. 6.3 (an exact zero sum of operands of opposite signs, or of +0 and -0, is +0 when rounding to
// nearest).

const law: MaterialLaw = {
  name: 'B/(mu0 1500) + 3 sinh(B/0.05) (invented)',
  fieldStrength: (b) => b / (MU0 * 1500) + 3 * Math.sinh(b / 0.05),
  fieldSlope: (b) => 1 / (MU0 * 1500) + (3 / 0.05) * Math.cosh(b / 0.05),
  energyDensity: (b) => (b * b) / (2 * MU0 * 1500) + 3 * 0.05 * (Math.cosh(b / 0.05) - 1),
};

/** A core with one window: two tubes of one law and area in series (one law value shared), a reluctance, a driven winding. */
function oneWindow() {
  const net = createNetwork('one window');
  const a = net.magneticNode('a');
  const b = net.magneticNode('b');
  const c = net.magneticNode('c');
  const leg = net.fluxTube('leg', { from: a, to: b, length: 0.031, area: 1.5e-4, material: law });
  net.fluxTube('yoke', { from: b, to: c, length: 0.047, area: 1.5e-4, material: law });
  net.reluctance('gap', { from: c, to: a, reluctance: 3.3e5 });
  const d = net.node('drive');
  net.voltageSource('drive', d, net.ground, pulse({ low: -7, high: 9, period: 2e-5, duty: 0.4 }));
  net.winding('coil', { tube: leg, turns: 13, resistance: 0.8, plus: d, minus: net.ground, orientation: -1 });
  return compileNetwork(net.describe());
}

/** Three legs (outer legs in one loop each, the centre leg in both) and a resistor: a size that is not a multiple of four. */
function threeLegs() {
  const net = createNetwork('three legs');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  net.fluxTube('left', { from: bottom, to: top, length: 0.06, area: 1e-4, material: law });
  const centre = net.fluxTube('centre', { from: top, to: bottom, length: 0.04, area: 2e-4, material: law });
  net.fluxTube('right', { from: bottom, to: top, length: 0.05, area: 1e-4, material: law });
  const d = net.node('drive');
  net.resistor('load', d, net.ground, 12);
  net.winding('coil', { tube: centre, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
  return compileNetwork(net.describe());
}

type Compiled = ReturnType<typeof compileNetwork>;

/** The loop rows of f and the loop block of df/dy from the tubes alone, read tube by tube (states with zero currents). */
function tubeReading(c: Compiled, y: Float64Array) {
  const n = c.layout.size;
  const f = new Float64Array(n);
  const J = new Float64Array(n * n);
  c.loops.tubeLoops.forEach((entries, b) => {
    let flux = 0;
    for (const e of entries) flux += e.sign * y[c.layout.loopOffset + e.loop]!;
    const F = c.tubeMmf(b, flux, y);
    const dF = c.tubes[b]!.mmfSlope(flux, y);
    for (const e of entries) f[c.layout.loopOffset + e.loop] = f[c.layout.loopOffset + e.loop]! - e.sign * F;
    for (const e1 of entries) {
      for (const e2 of entries) {
        const at = (c.layout.loopOffset + e1.loop) * n + c.layout.loopOffset + e2.loop;
        J[at] = J[at]! + -e1.sign * e2.sign * dF;
      }
    }
  });
  return { f, J };
}

describe('tubes in one loop and the cleared f', () => {
  it('give each tube the signed sum of its loop fluxes from 0, -0 read as +0', () => {
    for (const c of [oneWindow(), threeLegs()]) {
      const y = new Float64Array(c.layout.size);
      for (const loopFlux of [-0, 0, 2.5e-6, -4.1e-5]) {
        for (let l = 0; l < c.layout.loopCount; l++) y[c.layout.loopOffset + l] = loopFlux;
        c.loops.tubeLoops.forEach((entries, b) => {
          let sum = 0;
          for (const e of entries) sum += e.sign * y[c.layout.loopOffset + e.loop]!;
          expect(c.tubeFlux(y, b)).toBe(sum);
          if (loopFlux === 0) expect(Object.is(c.tubeFlux(y, b), 0)).toBe(true);
        });
      }
    }
  });

  it('f and df/dy equal the tube-by-tube reading, with the winding\'s MMF added after the tubes', () => {
    for (const c of [oneWindow(), threeLegs()]) {
      const n = c.layout.size;
      // One loop per tube somewhere: the case without a loop over the tube's loops.
      expect(Math.min(...c.loops.tubeLoops.map((l) => l.length))).toBe(1);
      const coil = c.elements.findIndex((e) => e.name === 'coil');
      const w = c.description.elements[coil] as { tube: number; turns: number; orientation: number };
      const row = c.layout.branchCurrent[coil]!;
      for (const scale of [1e-6, -3e-5, 6e-5]) {
        const y = new Float64Array(n);
        for (let l = 0; l < c.layout.loopCount; l++) y[c.layout.loopOffset + l] = scale * (1 - 0.41 * l);
        const ref = tubeReading(c, y);
        const f = new Float64Array(n);
        const J = new Float64Array(n * n);
        c.rhs(0, y, f);
        c.jacobian(0, y, J);
        for (let l = 0; l < c.layout.loopCount; l++) {
          const r = c.layout.loopOffset + l;
          expect(f[r]).toBe(ref.f[r]);
          for (let m = 0; m < c.layout.loopCount; m++) expect(J[r * n + c.layout.loopOffset + m]).toBe(ref.J[r * n + c.layout.loopOffset + m]);
        }
        // A winding current: its MMF sign N i lands in each loop row through its tube, after the tubes' drops.
        y[row] = 1.7;
        const withCurrent = new Float64Array(n);
        c.rhs(0, y, withCurrent);
        const sN = w.orientation * w.turns;
        for (const e of c.loops.tubeLoops[w.tube]!) {
          const r = c.layout.loopOffset + e.loop;
          expect(withCurrent[r]).toBe(ref.f[r]! + e.sign * (sN * 1.7));
        }
        for (const e of c.loops.tubeLoops[w.tube]!) expect(J[(c.layout.loopOffset + e.loop) * n + row]).toBe(e.sign * sN);
      }
    }
  });

  it('clear every entry of f before adding into it, whatever the size', () => {
    for (const c of [oneWindow(), threeLegs()]) {
      const n = c.layout.size;
      const y = Float64Array.from({ length: n }, (_, i) => 0.3 * (i + 1) - 1e-5 * i);
      const clean = new Float64Array(n);
      c.rhs(1e-6, y, clean);
      const stale = new Float64Array(n).fill(Number.NaN);
      c.rhs(1e-6, y, stale);
      for (let i = 0; i < n; i++) expect(stale[i]).toBe(clean[i]);
    }
  });
});
