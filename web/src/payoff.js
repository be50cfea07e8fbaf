// Hedgeleaf page: the trade's payoff at expiry and its break-even spots.
//
// Per unit of the trade from the priced legs (type, strike, signed quantity);
// piecewise linear in spot with kinks at the strikes (digitals jump there).

/** Payoff at expiry of the legs at spot `s`; `payouts[i]` is a digital leg's cash payout. */
export function payoffAt(legs, s, payouts = []) {
  let total = 0;
  legs.forEach((leg, i) => {
    const k = leg.strike;
    const payout = payouts[i] ?? 1;
    let value = 0;
    if (leg.type === 'call') value = Math.max(s - k, 0);
    else if (leg.type === 'put') value = Math.max(k - s, 0);
    else if (leg.type === 'digital-call') value = s > k ? payout : 0;
    else if (leg.type === 'digital-put') value = s < k ? payout : 0;
    else if (leg.type === 'stock') value = s;
    total += leg.quantity * value;
  });
  return total;
}

/**
 * Spots in (0, upper] where payoff - premium changes sign, ascending. Between
 * kinks the payoff is a straight line, so each root is exact; a jump across
 * zero (a digital) counts at its strike.
 */
export function breakEvens(legs, premium, upper, payouts = []) {
  const kinks = [...new Set(legs.filter((l) => l.strike > 0).map((l) => l.strike))].filter((k) => k < upper).sort((a, b) => a - b);
  const points = [0, ...kinks, upper];
  const f = (s) => payoffAt(legs, s, payouts) - premium;
  const out = [];
  const push = (x) => {
    if (x > 0 && x <= upper && !out.some((y) => Math.abs(y - x) < 1e-9 * Math.max(1, x))) out.push(x);
  };
  for (let i = 0; i + 1 < points.length; i += 1) {
    const a = points[i];
    const b = points[i + 1];
    // evaluate just inside the segment so a digital's jump at a kink belongs to the kink
    const eps = (b - a) * 1e-9;
    const fa = f(a + eps);
    const fb = f(b - eps);
    if (fa === 0 && fb === 0) continue;  // flat at break-even: no single spot to show
    if (fa === 0) push(a + eps);
    else if (fa * fb < 0) push(a + eps + (fa / (fa - fb)) * (b - a - 2 * eps));
    if (i + 1 < points.length - 1) {
      const after = f(b + (points[i + 2] - b) * 1e-9);
      if (fb * after < 0 && Math.abs(fb - after) > 0 && legs.some((l) => l.strike === b && l.type.startsWith('digital'))) push(b);
    }
  }
  return out.sort((a, b) => a - b).map((x) => Number(x.toPrecision(12)));
}
