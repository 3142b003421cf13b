// The diagnosis in the bench's words, as the engine words it: each part's designator and fault in words
// (parts[].words), each next test's probe positions, lifted parts and sentence (nextTests[].probes, liftedParts,
// instruction). The server copies them into the contract's fields and words nothing itself; the engine's own
// ids stay in the answer for the program, the screens show only these.
import type { DiagnosisOutput } from '@splitscope/diagnosis';

export function wordDiagnosis(out: DiagnosisOutput) {
  return {
    ...out,
    parts: out.parts.map((p) => ({ ...p, designator: p.words.designator, label: p.words.text })),
    nextTests: out.nextTests.map((t) => ({ ...t, redLabel: t.probes.red.label, blackLabel: t.probes.black.label, liftedLabels: t.liftedParts })),
  };
}
