// Hedgeleaf benchmark: the plain-JavaScript peer of the lattice kernel.
//
// What a page without WebAssembly would run: the backward induction written the
// way a web developer would write it, with a Float64Array row, a running spot
// product and Math.max per node. Same lattice (Cox-Ross-Rubinstein) and option as
// the module's benchKernel, so the values agree to rounding.

/**
 * Value of a put on a CRR lattice.
 * @param {{spot: number, strike: number, vol: number, rate: number, carry: number,
 *          expiry: number, steps: number, american: boolean}} o
 * @returns {number}
 */
export function peerPut(o) {
  const { spot, strike, vol, rate, carry, expiry, steps, american } = o;
  const dt = expiry / steps;
  const up = Math.exp(vol * Math.sqrt(dt));
  const down = 1 / up;
  const p = (Math.exp((rate - carry) * dt) - down) / (up - down);
  const discount = Math.exp(-rate * dt);
  const ratio = up / down;
  const values = new Float64Array(steps + 1);
  let s = spot * Math.pow(down, steps);
  for (let i = 0; i <= steps; i++) {
    values[i] = Math.max(strike - s, 0);
    s *= ratio;
  }
  for (let n = steps - 1; n >= 0; n--) {
    s = spot * Math.pow(down, n);
    for (let i = 0; i <= n; i++) {
      const hold = discount * (p * values[i + 1] + (1 - p) * values[i]);
      values[i] = american ? Math.max(hold, strike - s) : hold;
      s *= ratio;
    }
  }
  return values[0];
}
