/** Per-solve values: the linear stamps, sources and device parameters written into a compiled topology. */
import type { Element } from './circuit';
import type { Topology, Work } from './system';
import { breakdownVoltage, criticalVoltage, GISLAND, GMIN, VT } from './devices';
import { luColumnScale } from './lu';

/**
 * a[i] += v. Kept local: the stamping loops call it per entry, and an imported function is reached through a module
 * binding that some loaders (tsx) turn into a getter call.
 */
function add(a: Float64Array, i: number | undefined, v: number): void {
  a[i as number] = (a[i as number] as number) + v;
}

/** A conductance g between the nodes of slots s .. s+3 (functions, not closures: stamping runs once per solve). */
function cond(a: Float64Array, slots: Int32Array, s: number, g: number): void {
  add(a, slots[s], g);
  add(a, slots[s + 1], g);
  add(a, slots[s + 2], -g);
  add(a, slots[s + 3], -g);
}

/** The ±1 incidence of a branch current at slots s .. s+3. */
function branch(a: Float64Array, slots: Int32Array, s: number): void {
  add(a, slots[s], 1);
  add(a, slots[s + 1], -1);
  add(a, slots[s + 2], 1);
  add(a, slots[s + 3], -1);
}

/** Writes the circuit's values into the topology's work arrays: linear stamps, sources and device parameters. */
export function stampValues(top: Topology, elements: readonly Element[]): Work {
  const w = top.work;
  const { base: a, rhs0: b } = w;
  const { slots, slotStart } = top;
  a.fill(0);
  b.fill(0);
  let di = 0;
  let qi = 0;
  for (let ei = 0; ei < elements.length; ei++) {
    const e = elements[ei] as Element;
    const s = slotStart[ei] as number;
    switch (e.kind) {
      case 'R':
        cond(a, slots, s, 1 / e.value);
        break;
      case 'C':
        break;
      case 'I':
        add(b, slots[s], -e.value);
        add(b, slots[s + 1], e.value);
        break;
      case 'G':
        add(a, slots[s], e.gain);
        add(a, slots[s + 1], -e.gain);
        add(a, slots[s + 2], -e.gain);
        add(a, slots[s + 3], e.gain);
        break;
      case 'F':
        add(a, slots[s], e.gain);
        add(a, slots[s + 1], -e.gain);
        break;
      case 'V':
      case 'L':
        branch(a, slots, s);
        if (e.kind === 'V') add(b, slots[s + 4], e.value);
        break;
      case 'E':
        branch(a, slots, s);
        add(a, slots[s + 4], -e.gain);
        add(a, slots[s + 5], e.gain);
        break;
      case 'H':
        branch(a, slots, s);
        add(a, slots[s + 4], -e.gain);
        break;
      case 'D': {
        const m = e.model;
        if (m.rs > 0) cond(a, slots, s, e.area / m.rs);
        const is = m.is * e.area;
        const vte = m.n * VT;
        w.dIs[di] = is;
        w.dVte[di] = vte;
        w.dVcrit[di] = criticalVoltage(vte, is);
        w.dXbv[di] = breakdownVoltage(m.bv, m.ibv, is, vte);
        di++;
        break;
      }
      case 'Q': {
        const m = e.model;
        const ar = e.area;
        if (m.rc > 0) cond(a, slots, s, ar / m.rc);
        if (m.rb > 0) cond(a, slots, s + 4, ar / m.rb);
        if (m.re > 0) cond(a, slots, s + 8, ar / m.re);
        const is = m.is * ar;
        w.qPol[qi] = m.type === 'pnp' ? -1 : 1;
        w.qIs[qi] = is;
        w.qBf[qi] = m.bf;
        w.qBr[qi] = m.br;
        w.qVtf[qi] = m.nf * VT;
        w.qVtr[qi] = m.nr * VT;
        w.qVcrit[qi] = criticalVoltage(VT, is);
        // Gummel–Poon terms, area-scaled as ngspice bjtload.c / bjttemp.c
        w.qIse[qi] = m.ise * ar;
        w.qVte[qi] = m.ne * VT;
        w.qIsc[qi] = m.isc * ar;
        w.qVtc[qi] = m.nc * VT;
        w.qInvVaf[qi] = 1 / m.vaf;
        w.qInvVar[qi] = 1 / m.var;
        w.qOik[qi] = 1 / m.ikf / ar;
        w.qOikr[qi] = 1 / m.ikr / ar;
        w.qNkf[qi] = m.nkf;
        const rbm = Number.isNaN(m.rbm) ? m.rb : m.rbm; // NaN: RBM defaults to RB
        const modulated = m.rb > 0 && (rbm !== m.rb || Number.isFinite(m.irb));
        w.qRbpr[qi] = rbm / ar;
        w.qRbpi[qi] = (m.rb - rbm) / ar;
        w.qXjrb[qi] = Number.isFinite(m.irb) && m.rb > 0 ? m.irb * ar : 0;
        w.qGxSlot[qi] = modulated ? s + 4 : -1;
        w.qGx0[qi] = m.rb > 0 ? ar / m.rb : 0;
        cond(a, slots, s + 24, GMIN); // substrate junction's GMIN (compile.ts)
        qi++;
        break;
      }
    }
  }
  // islands of a derived state: a tiny conductance to the reference keeps the matrix regular
  for (let t = 0; t < top.islandPos.length; t++) add(a, top.islandPos[t], GISLAND);
  luColumnScale(a, top.lu, w.scale0);
  return w;
}
