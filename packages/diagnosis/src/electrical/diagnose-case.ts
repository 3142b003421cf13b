// A case file (netlist, parts, test points, readings) diagnosed or checked in one call, for the command line and
// for callers that hold no diagnoser of their own.
import { validateCaseShape, type DiagnosisCase, type DiagnosisOutput, type UpdateOptions } from './case.js';
import { Diagnoser } from './diagnoser.js';

/** Validate a case and diagnose it in one call. Throws CaseError on a bad case. */
export function diagnoseCase(caseInput: unknown, options: UpdateOptions = {}): DiagnosisOutput {
  const c = validateCaseShape(caseInput);
  const d = new Diagnoser({
    netlist: c.netlist,
    params: c.params,
    parts: c.parts,
    testPoints: c.testPoints,
    connectors: c.connectors,
    meter: options.meter ?? c.meter,
  });
  return d.update(c.readings, options);
}

/** Full validation of a case against its netlist (shape, nets, parts). Returns the typed case. */
export function validateCase(caseInput: unknown): DiagnosisCase {
  const c = validateCaseShape(caseInput);
  new Diagnoser({ netlist: c.netlist, params: c.params, parts: c.parts, testPoints: c.testPoints }).observations(c.readings);
  return c;
}
