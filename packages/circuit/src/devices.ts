/** Junction models of the diode and the BJT (ngspice dioload / bjtload forms) and their stamps. */
import type { Topology, Work } from './compile';

/** Thermal voltage kT/q at 27 °C (300.15 K) with the constants ngspice uses (CONSTboltz, CHARGE). */
export const VT = (1.38064852e-23 * 300.15) / 1.6021766208e-19;
/** Conductance SPICE puts across every pn junction (ngspice default GMIN). */
export const GMIN = 1e-12;
/** Conductance from nodes with no DC path to the reference (islands of a derived board state). */
export const GISLAND = 1e-12;

/** a[i] += v (local to each stamping module, see stamp.ts). */
function add(a: Float64Array, i: number | undefined, v: number): void {
  a[i as number] = (a[i as number] as number) + v;
}

/** Breakdown voltage adjusted so that the current at -BV equals IBV (ngspice diotemp.c); Infinity without BV. */
export function breakdownVoltage(bv: number, ibv: number, is: number, vt: number): number {
  if (!Number.isFinite(bv)) return Infinity;
  const cbv = ibv;
  if (cbv < (is * bv) / vt) return bv;
  const tol = 1e-3 * cbv;
  let xbv = bv - vt * Math.log(1 + cbv / is);
  for (let i = 0; i < 25; i++) {
    xbv = bv - vt * Math.log(cbv / is + 1 - xbv / vt);
    const xcbv = is * (Math.exp((bv - xbv) / vt) - 1 + xbv / vt);
    if (Math.abs(xcbv - cbv) <= tol) break;
  }
  return xbv;
}

/** Critical voltage of pnjlim: where the junction current's curvature makes Newton steps unsafe (ngspice). */
export function criticalVoltage(vt: number, is: number): number {
  return vt * Math.log(vt / (Math.SQRT2 * is));
}

/** Set by pnjlim when it limited a step: the iteration cannot count as converged. */
const limit = { hit: false };

/** SPICE junction voltage limiting (ngspice DEVpnjlim). Returns the limited voltage; sets limit.hit. */
export function pnjlim(vnew: number, vold: number, vt: number, vcrit: number): number {
  if (vnew > vcrit && Math.abs(vnew - vold) > vt + vt) {
    limit.hit = true;
    if (vold > 0) {
      const arg = 1 + (vnew - vold) / vt;
      return arg > 0 ? vold + vt * Math.log(arg) : vcrit;
    }
    return vt * Math.log(vnew / vt);
  }
  if (vnew < 0) {
    const arg = vold > 0 ? -1 * vold - 1 : 2 * vold - 1;
    if (vnew < arg) {
      limit.hit = true;
      return arg;
    }
  }
  return vnew;
}

/** Result of `junction`: current and conductance (module scratch: solving is synchronous). */
export const jv = { i: 0, g: 0 };

/** Junction current and conductance (ngspice dioload/bjtload): forward exponential, reverse cubic, breakdown. */
export function junction(v: number, is: number, vte: number, xbv: number): void {
  if (v >= -3 * vte) {
    const ev = Math.exp(v / vte);
    jv.i = is * (ev - 1);
    jv.g = (is * ev) / vte;
  } else if (v >= -xbv) {
    let arg = (3 * vte) / (v * Math.E);
    arg = arg * arg * arg;
    jv.i = -is * (1 + arg);
    jv.g = (is * 3 * arg) / v;
  } else {
    const ev = Math.exp(-(xbv + v) / vte);
    jv.i = -is * ev;
    jv.g = (is * ev) / vte;
  }
}

/**
 * Adds the companion model of every junction to w.asm / w.b, at the junction voltages of the iterate w.x after
 * pnjlim (at the stored start voltages on the first iteration). Kept in this module with the functions it calls in
 * its inner loop. Returns true when pnjlim limited a junction step (the iterate cannot count as converged).
 */
export function stampJunctions(top: Topology, w: Work, first: boolean): boolean {
  const { asm: a, b, x } = w;
  limit.hit = false;
  const { dPos, dRow, dX, qPos, qRow, qX } = top;
  const nd = top.dEl.length;
  for (let i = 0; i < nd; i++) {
    const vte = w.dVte[i] as number;
    const xbv = w.dXbv[i] as number;
    const vold = w.dVold[i] as number;
    let vd = vold;
    if (!first) {
      vd = (x[dX[2 * i] as number] as number) - (x[dX[2 * i + 1] as number] as number);
      if (xbv < Infinity && vd < Math.min(0, -xbv + 10 * vte)) vd = -(pnjlim(-(vd + xbv), -(vold + xbv), vte, w.dVcrit[i] as number) + xbv);
      else vd = pnjlim(vd, vold, vte, w.dVcrit[i] as number);
    }
    w.dVold[i] = vd;
    junction(vd, w.dIs[i] as number, vte, xbv);
    const gd = jv.g + GMIN;
    const ieq = jv.i + GMIN * vd - gd * vd;
    const p = 4 * i;
    add(a, dPos[p], gd);
    add(a, dPos[p + 1], gd);
    add(a, dPos[p + 2], -gd);
    add(a, dPos[p + 3], -gd);
    add(b, dRow[2 * i], -ieq);
    add(b, dRow[2 * i + 1], ieq);
  }
  const nq = top.qEl.length;
  for (let i = 0; i < nq; i++) {
    const pol = w.qPol[i] as number;
    const xc = x[qX[3 * i] as number] as number;
    const xb = x[qX[3 * i + 1] as number] as number;
    const xe = x[qX[3 * i + 2] as number] as number;
    let vbe = w.qVbe[i] as number;
    let vbc = w.qVbc[i] as number;
    if (!first) {
      const vcrit = w.qVcrit[i] as number;
      vbe = pnjlim(pol * (xb - xe), vbe, VT, vcrit);
      vbc = pnjlim(pol * (xb - xc), vbc, VT, vcrit);
    }
    w.qVbe[i] = vbe;
    w.qVbc[i] = vbc;
    const is = w.qIs[i] as number;
    const br = w.qBr[i] as number;
    const bf = w.qBf[i] as number;
    junction(vbe, is, w.qVtf[i] as number, Infinity);
    const cbe = jv.i;
    const gbe = jv.g;
    junction(vbc, is, w.qVtr[i] as number, Infinity);
    const cbc = jv.i;
    const gbc = jv.g;
    const ic = cbe - cbc - cbc / br - GMIN * vbc;
    const ib = cbe / bf + GMIN * vbe + cbc / br + GMIN * vbc;
    const g11 = gbe;
    const g12 = -(gbc + gbc / br + GMIN);
    const g21 = gbe / bf + GMIN;
    const g22 = gbc / br + GMIN;
    const ceq = pol * (ic - g11 * vbe - g12 * vbc);
    const beq = pol * (ib - g21 * vbe - g22 * vbc);
    const p = 9 * i;
    add(a, qPos[p], g11 + g12);
    add(a, qPos[p + 1], -g11);
    add(a, qPos[p + 2], -g12);
    add(a, qPos[p + 3], g21 + g22);
    add(a, qPos[p + 4], -g21);
    add(a, qPos[p + 5], -g22);
    add(a, qPos[p + 6], -(g11 + g12 + g21 + g22));
    add(a, qPos[p + 7], g11 + g21);
    add(a, qPos[p + 8], g12 + g22);
    add(b, qRow[3 * i], -ceq);
    add(b, qRow[3 * i + 1], -beq);
    add(b, qRow[3 * i + 2], ceq + beq);
  }
  return limit.hit;
}
