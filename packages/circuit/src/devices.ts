/** Junction models of the diode and the BJT (ngspice dioload / bjtload forms) and their stamps. */
import type { Topology, Work } from './system';

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

/** Result of `gummelPoon`: terminal currents, their derivatives and the base conductance (module scratch). */
export const bq = { ic: 0, ib: 0, g11: 0, g12: 0, g21: 0, g22: 0, gx: 0 };

/**
 * DC Gummel–Poon model of BJT i at junction voltages vbe, vbc (polarity applied), as ngspice bjtload.c computes it
 * (ngspice manual ch. 8; Massobrio & Antognetti, "Semiconductor Device Modeling with SPICE", 2nd ed., §2.4):
 *   ideal currents cbe = IS(e^{vbe/NF·Vt} − 1), cbc = IS(e^{vbc/NR·Vt} − 1); leakage cben = ISE(e^{vbe/NE·Vt} − 1),
 *   cbcn = ISC(e^{vbc/NC·Vt} − 1), each with GMIN in parallel;
 *   base charge qb = q1 (1 + (1 + 4 q2)^NKF) / 2, q1 = 1 / (1 − vbc/VAF − vbe/VAR), q2 = cbe/IKF + cbc/IKR;
 *   ic = (cbe − cbc)/qb − cbc/BR − cbcn;  ib = cbe/BF + cben + cbc/BR + cbcn;
 *   base resistance RBM + (RB − RBM)/qb, or with IRB the tan(z) form of the manual.
 * Writes bq: ic, ib and g11 = ∂ic/∂vbe, g12 = ∂ic/∂vbc, g21 = ∂ib/∂vbe, g22 = ∂ib/∂vbc, gx = 1/rb (0 without RB).
 */
export function gummelPoon(w: Work, i: number, vbe: number, vbc: number): void {
  junction(vbe, w.qIs[i] as number, w.qVtf[i] as number, Infinity);
  const cbe = jv.i;
  const gbe = jv.g;
  junction(vbc, w.qIs[i] as number, w.qVtr[i] as number, Infinity);
  const cbc = jv.i;
  const gbc = jv.g;
  let cben = GMIN * vbe;
  let gben = GMIN;
  const ise = w.qIse[i] as number;
  if (ise > 0) {
    junction(vbe, ise, w.qVte[i] as number, Infinity);
    cben += jv.i;
    gben += jv.g;
  }
  let cbcn = GMIN * vbc;
  let gbcn = GMIN;
  const isc = w.qIsc[i] as number;
  if (isc > 0) {
    junction(vbc, isc, w.qVtc[i] as number, Infinity);
    cbcn += jv.i;
    gbcn += jv.g;
  }
  const invVaf = w.qInvVaf[i] as number;
  const invVar = w.qInvVar[i] as number;
  const oik = w.qOik[i] as number;
  const oikr = w.qOikr[i] as number;
  const q1 = 1 / (1 - invVaf * vbc - invVar * vbe);
  let qb: number;
  let dqbdve: number;
  let dqbdvc: number;
  if (oik === 0 && oikr === 0) {
    qb = q1;
    dqbdve = q1 * qb * invVar;
    dqbdvc = q1 * qb * invVaf;
  } else {
    const nkf = w.qNkf[i] as number;
    const q2 = oik * cbe + oikr * cbc;
    const arg = Math.max(0, 1 + 4 * q2);
    let sqarg = 1;
    if (arg !== 0) sqarg = nkf === 0.5 ? Math.sqrt(arg) : Math.pow(arg, nkf);
    qb = (q1 * (1 + sqarg)) / 2;
    if (nkf === 0.5) {
      dqbdve = q1 * (qb * invVar + (oik * gbe) / sqarg);
      dqbdvc = q1 * (qb * invVaf + (oikr * gbc) / sqarg);
    } else {
      dqbdve = q1 * (qb * invVar + (oik * gbe * 2 * sqarg * nkf) / arg);
      dqbdvc = q1 * (qb * invVaf + (oikr * gbc * 2 * sqarg * nkf) / arg);
    }
  }
  const br = w.qBr[i] as number;
  const bf = w.qBf[i] as number;
  const cc = (cbe - cbc) / qb - cbc / br - cbcn;
  const cb = cbe / bf + cben + cbc / br + cbcn;
  const go = (gbc + ((cbe - cbc) * dqbdvc) / qb) / qb;
  const gm = (gbe - ((cbe - cbc) * dqbdve) / qb) / qb - go;
  const gpi = gbe / bf + gben;
  const gmu = gbc / br + gbcn;
  bq.ic = cc;
  bq.ib = cb;
  bq.g11 = gm + go;
  bq.g12 = -(go + gmu);
  bq.g21 = gpi;
  bq.g22 = gmu;
  const rbpr = w.qRbpr[i] as number;
  const rbpi = w.qRbpi[i] as number;
  let rx = rbpr + rbpi / qb;
  const xjrb = w.qXjrb[i] as number;
  if (xjrb !== 0) {
    let arg1 = Math.max(cb / xjrb, 1e-9);
    const arg2 = (-1 + Math.sqrt(1 + 14.59025 * arg1)) / 2.4317 / Math.sqrt(arg1);
    arg1 = Math.tan(arg2);
    rx = rbpr + (3 * rbpi * (arg1 - arg2)) / arg2 / arg1 / arg1;
  }
  bq.gx = rx !== 0 ? 1 / rx : 0;
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
    gummelPoon(w, i, vbe, vbc);
    const { ic, ib, g11, g12, g21, g22 } = bq;
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
    // base resistance modulated by the base charge or the base current: the part above 1/RB, stamped at the value
    // of this iterate without its derivative (as ngspice bjtload.c does)
    const gs = w.qGxSlot[i] as number;
    if (gs >= 0) {
      const dg = bq.gx - (w.qGx0[i] as number);
      const slots = top.slots;
      add(a, slots[gs], dg);
      add(a, slots[gs + 1], dg);
      add(a, slots[gs + 2], -dg);
      add(a, slots[gs + 3], -dg);
    }
  }
  return limit.hit;
}
