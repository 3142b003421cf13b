import { z } from 'zod';
import { boardModelSchema } from './board-model';
import { counterSchema } from './bounds';
import { idSchema, isoDateTime, optionalText } from './common';
import { meterModeSchema, powerStateSchema, readingUnitSchema } from './readings';

/**
 * A board model document (netlist, parts, test points, sections, fault codes): `boardModelSchema` in
 * `board-model.ts`. Requests are checked against it, and the server's engine adapter takes the parsed model.
 */
export const boardDocumentSchema = boardModelSchema;
export type BoardDocument = z.infer<typeof boardDocumentSchema>;

/** One row of the expected-readings table computed from the board model's netlist. */
export const expectedReadingSchema = z.looseObject({
  id: z.string(),
  label: z.string().optional(),
  mode: meterModeSchema,
  red: z.string(),
  black: z.string(),
  power: powerStateSchema,
  lifted: z.array(z.string()).default([]),
  expected: z.union([z.number(), z.literal('OL'), z.boolean()]),
  low: z.number().nullable(),
  high: z.number().nullable(),
  unit: readingUnitSchema,
  /** Where the healthy band comes from, when a standard or datasheet fixes it. */
  source: z.string().optional(),
  /** What the technician should know about the reading, e.g. a parallel path that muddies an ohm reading. */
  note: z.string().optional(),
});
export type ExpectedReadingRow = z.infer<typeof expectedReadingSchema>;

export const faultCodeSchema = z.object({
  id: idSchema,
  boardId: idSchema.nullable(),
  code: z.string(),
  title: z.string(),
  description: z.string().nullable(),
  /** Sections of the board the code points at (section ids of the board model). */
  sections: z.array(z.string()),
  /** Per suspect section, how much more likely the code is when the fault is there (the rule beside FAULT_CODE_WEIGHT). */
  weights: z.record(z.string(), z.number()).default({}),
});
export type FaultCode = z.infer<typeof faultCodeSchema>;

export const boardSummarySchema = z.object({
  id: idSchema,
  key: z.string(),
  name: z.string(),
  /** The newest version; jobs pin the version they were diagnosed on. */
  version: z.number().int().positive(),
  versionId: idSchema,
  updatedAt: isoDateTime,
});
export type BoardSummary = z.infer<typeof boardSummarySchema>;

export const boardDetailSchema = boardSummarySchema.extend({
  document: boardDocumentSchema,
  /** Where to GET the board's picture: its photo upload, or the drawing of its composition; null when it has neither. */
  pictureUrl: z.string().nullable(),
  expectedReadings: z.array(expectedReadingSchema),
  faultCodes: z.array(faultCodeSchema),
  /**
   * Set when the stored document of this version fails the schema even after the in-memory upgrade: `document` is
   * then the board as its photo and the test points that still read (readings recorded, not judged), `message` the
   * schema's complaint and `stored` the document as stored, for the lead who corrects it.
   */
  modelProblem: z.object({ message: z.string(), stored: z.unknown() }).nullable().optional(),
});
export type BoardDetail = z.infer<typeof boardDetailSchema>;

export const boardListResponse = z.object({ items: z.array(boardSummarySchema) });
export type BoardList = z.infer<typeof boardListResponse>;

export const boardDetailQuery = z.object({ version: z.coerce.number().pipe(counterSchema).optional() });

export const createBoardRequest = z.object({ document: boardDocumentSchema, note: optionalText(500) });
export type CreateBoardRequest = z.infer<typeof createBoardRequest>;

/** Editing a board model stores a new version; jobs keep the version they pinned. */
export const updateBoardRequest = z.object({ document: boardDocumentSchema, note: optionalText(500) });
export type UpdateBoardRequest = z.infer<typeof updateBoardRequest>;

/** A lead's corrected form of a stored version the schema rejects; a version that reads is never rewritten. */
export const correctBoardVersionRequest = z.object({ document: boardDocumentSchema });
export type CorrectBoardVersionRequest = z.infer<typeof correctBoardVersionRequest>;

export const boardVersionSchema = z.object({
  versionId: idSchema,
  version: z.number().int().positive(),
  note: z.string().nullable(),
  createdBy: idSchema.nullable(),
  createdByName: z.string().nullable(),
  createdAt: isoDateTime,
});
export type BoardVersion = z.infer<typeof boardVersionSchema>;
export const boardVersionListResponse = z.object({ items: z.array(boardVersionSchema) });
export type BoardVersionList = z.infer<typeof boardVersionListResponse>;

export const faultCodeListQuery = z.object({ boardId: idSchema.optional() });
export const faultCodeListResponse = z.object({ items: z.array(faultCodeSchema) });
export type FaultCodeList = z.infer<typeof faultCodeListResponse>;

const faultCodeWeights = z.record(
  z.string().trim().min(1).max(50),
  z.number({ error: 'Weight must be a number' }).min(1, { error: 'A weight is at least 1 (1 = no steer)' }).max(50, { error: 'A weight is at most 50' }),
);

export const createFaultCodeRequest = z.object({
  boardId: idSchema.nullable().optional(),
  code: z.string().trim().min(1).max(20),
  title: z.string().trim().min(1).max(200),
  description: optionalText(4000),
  sections: z.array(z.string().trim().min(1).max(50)).max(20).default([]),
  weights: faultCodeWeights.default({}),
});
export type CreateFaultCodeRequest = z.input<typeof createFaultCodeRequest>;

/** The shop edits a code's words and where it points; the board it belongs to stays. */
export const updateFaultCodeRequest = createFaultCodeRequest.omit({ boardId: true });
export type UpdateFaultCodeRequest = z.input<typeof updateFaultCodeRequest>;

/**
 * How a fault code steers the diagnosis (the rule, in one place). A unit that shows code K is evidence; for a
 * part in a suspect section s of K, the shop's weight w_s is the likelihood ratio P(K | the fault is in s) /
 * P(K | the fault is elsewhere), and the part's fault-mode priors are updated by the odds form of Bayes' rule,
 * posterior odds = w_s × prior odds (Pearl 1988, "Probabilistic Reasoning in Intelligent Systems", §2.1.2; from
 * memory). A section without a weight takes FAULT_CODE_WEIGHT (5, from memory: a code that names a section makes a
 * fault there about five times likelier than one elsewhere). Every fault mode of each part in a suspect section moves; parts elsewhere keep their priors. Weights run from 1 (no steer) to 50.
 */
export const FAULT_CODE_WEIGHT = 5;
