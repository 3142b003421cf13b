/**
 * SPICE number syntax: a number followed by an optional scale suffix and ignored trailing letters
 * (Berkeley SPICE3 user's guide, "Numeric values"): f=1e-15 p=1e-12 n=1e-9 u=1e-6 m=1e-3 k=1e3
 * meg=1e6 g=1e9 t=1e12 mil=25.4e-6, case-insensitive. "10kohm" is 10e3, "1uF" is 1e-6, "2.2MEG" is 2.2e6.
 * Note that SPICE reads "M" as milli; mathjs units would read it as mega, so SPICE values are parsed here
 * and mathjs is used for {expressions}.
 */
const NUMBER_RE = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)([a-zA-Z_µ]*)$/;

const SCALE: Record<string, number> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  m: 1e-3,
  k: 1e3,
  g: 1e9,
  t: 1e12,
};

/** Parses a SPICE number token; returns undefined when the token is not a number. */
export function parseSpiceNumber(token: string): number | undefined {
  const m = NUMBER_RE.exec(token.trim());
  if (!m) return undefined;
  const base = Number(m[1]);
  if (!Number.isFinite(base)) return undefined;
  const suffix = (m[2] ?? '').toLowerCase();
  if (suffix === '') return base;
  if (suffix.startsWith('meg')) return base * 1e6;
  if (suffix.startsWith('mil')) return base * 25.4e-6;
  const scale = SCALE[suffix[0] as string];
  return scale === undefined ? base : base * scale;
}

/**
 * Rewrites SPICE-suffixed numbers inside an expression ("2k*3") into plain numbers ("2000*3") so that mathjs
 * can evaluate it. Identifiers such as "r1k" are left alone.
 */
export function rewriteSuffixedNumbers(expr: string): string {
  return expr.replace(/(?<![A-Za-z_\d.])((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(meg|mil|[fpnumkgtµ])[a-zA-Z]*(?![\w])/gi, (_all, num: string, suf: string) => {
    const v = parseSpiceNumber(num + suf);
    return v === undefined ? _all : `(${String(v)})`;
  });
}
