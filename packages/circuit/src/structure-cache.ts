/**
 * The cache of compiled topologies, keyed by a circuit's structure (see compile.ts for what a topology holds).
 */
import type { Circuit, Element } from './circuit';
import { compileTopology } from './compile';
import type { Topology } from './system';

/**
 * The structure of a circuit as integers: per element its kind and node count, its nodes, and the names that
 * define branches, internal nodes and controls, each string interned to a number. Values are left out: they are
 * stamped on every solve. Interning costs one Map lookup per string (V8 keeps a string's hash), far less than
 * building and hashing one long string key.
 */
const interned = new Map<string, number>();
const KINDS = 'RCLVIDQEGFH';
let codes = new Int32Array(1024);
let codeLength = 0;

function intern(s: string): number {
  let i = interned.get(s);
  if (i === undefined) {
    i = interned.size + 1;
    interned.set(s, i);
  }
  return i;
}

function push(v: number): void {
  if (codeLength === codes.length) {
    const grown = new Int32Array(codes.length * 2);
    grown.set(codes);
    codes = grown;
  }
  codes[codeLength++] = v;
}

/** Writes the structure codes of the circuit into `codes[0 .. codeLength)` and returns their hash (FNV-1a). */
function structureCodes(elements: readonly Element[], extraNodes: readonly string[]): number {
  codeLength = 0;
  push(extraNodes.length);
  for (const nd of extraNodes) push(intern(nd));
  for (const e of elements) {
    let kind = KINDS.indexOf(e.kind) + 16 * e.nodes.length;
    if (e.kind === 'D' && e.model.rs > 0) kind += 256;
    if (e.kind === 'Q') kind += 256 * ((e.model.rc > 0 ? 1 : 0) + (e.model.rb > 0 ? 2 : 0) + (e.model.re > 0 ? 4 : 0) + (e.model.subs === -1 ? 8 : 0));
    push(kind);
    for (const nd of e.nodes) push(intern(nd));
    if (e.kind === 'Q') push(intern(e.substrate ?? '0'));
    if (e.kind === 'V' || e.kind === 'L' || e.kind === 'E' || e.kind === 'H' || kind >= 256) push(intern(e.name));
    if (e.kind === 'F' || e.kind === 'H') push(intern(e.control));
  }
  let h = 0x811c9dc5;
  for (let i = 0; i < codeLength; i++) h = Math.imul(h ^ (codes[i] as number), 16777619);
  return h;
}

function sameCodes(stored: Int32Array): boolean {
  if (stored.length !== codeLength) return false;
  for (let i = 0; i < codeLength; i++) if (stored[i] !== codes[i]) return false;
  return true;
}

/** Compiled topologies by structure hash (collisions share a bucket), and all of them in least-recent-first order. */
const buckets = new Map<number, Topology[]>();
const recency = new Map<Topology, number>();
/** Enough for every state and fault variant of a few boards; the least recently used entry is dropped beyond it. */
export const TOPOLOGY_CACHE_SIZE = 256;

/** Empties the topology cache (the benchmark uses it to time a first solve of a structure). */
export function clearTopologyCache(): void {
  buckets.clear();
  recency.clear();
  interned.clear();
}

/** The compiled system for the circuit's structure, from the cache or compiled now (throws on a bad control). */
export function topologyOf(circuit: Circuit, extraNodes: readonly string[]): Topology {
  // interned numbers only grow; start over (with the topologies that use them) before the map gets large
  if (interned.size > 1 << 20) clearTopologyCache();
  const hash = structureCodes(circuit.elements, extraNodes);
  const bucket = buckets.get(hash);
  let hit: Topology | undefined;
  if (bucket) {
    for (const t of bucket) {
      if (sameCodes(t.codes)) {
        hit = t;
        break;
      }
    }
  }
  if (hit) {
    recency.delete(hit);
    recency.set(hit, hash);
    return hit;
  }
  const top = compileTopology(circuit.elements, extraNodes, codes.slice(0, codeLength));
  if (bucket) bucket.push(top);
  else buckets.set(hash, [top]);
  recency.set(top, hash);
  if (recency.size > TOPOLOGY_CACHE_SIZE) {
    const [old, oldHash] = recency.entries().next().value as [Topology, number];
    recency.delete(old);
    const b = buckets.get(oldHash) as Topology[];
    b.splice(b.indexOf(old), 1);
    if (b.length === 0) buckets.delete(oldHash);
  }
  return top;
}
