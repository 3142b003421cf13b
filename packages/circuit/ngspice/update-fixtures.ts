/**
 * Regenerates expected.json from the decks with the installed ngspice:
 *   tsx packages/circuit/ngspice/update-fixtures.ts
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ngspiceOp, ngspiceVersion } from './ngspice';

const here = dirname(fileURLToPath(import.meta.url));
const decks = readdirSync(join(here, 'decks')).filter((f) => f.endsWith('.cir')).sort();
const out: Record<string, unknown> = { generatedBy: ngspiceVersion(), decks: {} };
for (const f of decks) {
  (out.decks as Record<string, unknown>)[f] = ngspiceOp(readFileSync(join(here, 'decks', f), 'utf8'));
}
writeFileSync(join(here, 'expected.json'), JSON.stringify(out, null, 2) + '\n');
console.log(`wrote ${decks.length} decks`);
