/** Deterministic random netlists for the benchmark: the same netlists on every run. */

/** Deterministic PRNG (mulberry32). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random connected resistor network with diodes and one supply; `nodes` non-reference nodes. */
export function randomNetlist(nodes: number, seed: number): string {
  const r = rng(seed);
  const pick = (n: number) => Math.floor(r() * n);
  const res = () => (100 * Math.pow(1000, r())).toPrecision(4); // 100 Ω … 100 kΩ, log-uniform
  const name = (i: number) => (i === 0 ? '0' : `n${i}`);
  const lines = [`random ${nodes}-node resistor and diode network (seed ${seed})`, 'V1 n1 0 12'];
  let k = 0;
  for (let i = 2; i <= nodes; i++) lines.push(`R${++k} ${name(pick(i))} ${name(i)} ${res()}`);
  for (let j = 0; j < Math.ceil(nodes / 2); j++) {
    const a = pick(nodes + 1);
    const b = pick(nodes + 1);
    if (a !== b) lines.push(`R${++k} ${name(a)} ${name(b)} ${res()}`);
  }
  let d = 0;
  for (let j = 0; j < Math.ceil(nodes / 5); j++) {
    const a = 1 + pick(nodes);
    const b = pick(nodes + 1);
    if (a !== b) lines.push(`D${++d} ${name(a)} ${name(b)} dm`);
  }
  lines.push('.model dm D(IS=1e-14 N=1.5 RS=1)', '.op', '.end');
  return lines.join('\n') + '\n';
}
