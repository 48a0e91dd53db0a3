import { describe, expect, it } from 'vitest';
import { compileNetwork } from '../../src/formulation/compile-network.js';
import { createNetwork, MU0, type MaterialLaw } from '../../src/index.js';

// A tube's MMF drop F_b(phi_b), with phi_b the signed sum of the loop fluxes through it, enters every
// loop through it with the loop's sign (mesh analysis of a magnetic circuit: e.g. Hayt and Buck,
// Engineering Electromagnetics, sect. 9.8; common practice). f and df/dy read each tube's loops once
// for its flux and its scatter; here they are checked bit for bit against the straightforward reading:
// the flux as the compiled network's tubeFlux sums it, the drop from the tube's own mmf and mmfSlope,
// added into the loop rows tube by tube in tube order.

const law: MaterialLaw = {
  name: 'B/(mu0 2000) + 2 sinh(B/0.04) (invented)',
  fieldStrength: (b) => b / (MU0 * 2000) + 2 * Math.sinh(b / 0.04),
  fieldSlope: (b) => 1 / (MU0 * 2000) + (2 / 0.04) * Math.cosh(b / 0.04),
  energyDensity: (b) => (b * b) / (2 * MU0 * 2000) + 2 * 0.04 * (Math.cosh(b / 0.04) - 1),
};

/** A three-leg core (the centre leg in both loops), a reluctance leg among them, a winding on the centre leg. */
function threeLegCore() {
  const net = createNetwork('three legs');
  const bottom = net.magneticNode('bottom');
  const top = net.magneticNode('top');
  net.fluxTube('left', { from: bottom, to: top, length: 0.06, area: 1e-4, material: law });
  const centre = net.fluxTube('centre', { from: bottom, to: top, length: 0.04, area: 2e-4, material: law });
  net.reluctance('gap', { from: top, to: bottom, reluctance: 2e6 });
  net.fluxTube('right', { from: top, to: bottom, length: 0.05, area: 1e-4, material: law });
  const d = net.node('drive');
  net.resistor('load', d, net.ground, 10);
  net.winding('coil', { tube: centre, turns: 20, resistance: 0.5, plus: d, minus: net.ground });
  return compileNetwork(net.describe());
}

describe('f and df/dy of tubes in several loops', () => {
  it('equal the tube-by-tube reading of each tube\'s flux, drop and slope, bit for bit', () => {
    const c = threeLegCore();
    const n = c.layout.size;
    const tubeLoops = c.loops.tubeLoops.map((entries) => entries.map((e) => ({ row: c.layout.loopOffset + e.loop, sign: e.sign })));
    // The centre leg is in more than one loop: the case where reading its loops once matters.
    expect(Math.max(...tubeLoops.map((l) => l.length))).toBeGreaterThan(1);
    for (const scale of [1e-6, 3e-5, -7e-5]) {
      // Loop fluxes only: zero currents and potentials, so the windings' MMFs add +-0 and leave the loop rows as the tubes make them.
      const y = new Float64Array(n);
      for (let l = 0; l < c.layout.loopCount; l++) y[c.layout.loopOffset + l] = scale * (1 + 0.37 * l);
      const f = new Float64Array(n);
      c.rhs(0, y, f);
      const J = new Float64Array(n * n);
      c.jacobian(0, y, J);
      const fRef = new Float64Array(n);
      const jRef = new Float64Array(n * n);
      c.tubes.forEach((tube, b) => {
        const flux = c.tubeFlux(y, b);
        const F = c.tubeMmf(b, flux, y);
        const dF = tube.mmfSlope(flux, y);
        for (const e of tubeLoops[b]!) fRef[e.row] = fRef[e.row]! - e.sign * F;
        for (const e1 of tubeLoops[b]!) for (const e2 of tubeLoops[b]!) jRef[e1.row * n + e2.row] = jRef[e1.row * n + e2.row]! + -e1.sign * e2.sign * dF;
      });
      for (let l = 0; l < c.layout.loopCount; l++) {
        const r = c.layout.loopOffset + l;
        expect(f[r]).toBe(fRef[r]);
        for (let m = 0; m < c.layout.loopCount; m++) expect(J[r * n + c.layout.loopOffset + m]).toBe(jRef[r * n + c.layout.loopOffset + m]);
      }
    }
  });
});
