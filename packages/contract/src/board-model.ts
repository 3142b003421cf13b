import { z } from 'zod';
import { BOUNDS, boardNumber, voltsSchema } from './bounds';

/**
 * Board-model documents: the data that turns a board picture into a workbench. Stored by the server (which owns
 * `schemaVersion` migrations), read by the web app, computed on by @splitscope/boards and @splitscope/diagnosis.
 * Hot side = referenced to bus negative (SPICE node "0"); cold side = microcontroller ground (e.g. "gnd_c").
 */
export const BOARD_MODEL_SCHEMA_VERSION = 2;

export const boardSideSchema = z.enum(['hot', 'cold']);
export type BoardSide = z.infer<typeof boardSideSchema>;
export const boardPowerStateSchema = z.enum(['on', 'off']);
export const boardMeterModeSchema = z.enum(['dcv', 'ohm', 'diode', 'continuity']);
export type BoardMeterMode = z.infer<typeof boardMeterModeSchema>;

export const boardPartKinds = [
  'resistor',
  'ceramic-capacitor',
  'electrolytic-capacitor',
  'film-capacitor',
  'diode',
  'led',
  'zener',
  'bjt',
  'opto-coupler',
  'regulator',
  'connector',
  'fuse',
  'thermistor',
  'ic',
  'other',
] as const;
export const boardPartKindSchema = z.enum(boardPartKinds);
export type BoardPartKind = z.infer<typeof boardPartKindSchema>;

const id = z.string().min(1).max(64);
const coord = boardNumber(BOUNDS.boardCoordinate, 'a position on the board picture');
/** A part value or parameter in SI units (ohms, farads, volts, a CTR): bounded so a slip such as 1e308 is refused. */
const siValue = boardNumber(BOUNDS.boardValue, 'a part value or parameter');
const pictureSize = boardNumber({ min: 1, max: BOUNDS.boardCoordinate.max }, 'the picture size');

/**
 * The board's picture. A photo is an upload (PNG or JPEG, stored beside the document and referenced by id, never
 * inlined); a board composed from templates without a photo is drawn from its composition by the server. Either
 * way the document stays small: no picture bytes travel inside it.
 */
export const boardPictureSchema = z.object({
  uploadId: id.optional(),
  width: pictureSize,
  height: pictureSize,
  units: z.enum(['mm', 'px']),
});
export type BoardPicture = z.infer<typeof boardPictureSchema>;

/** Fault mode → prior probability, overriding the diagnosis engine's default for the part's kind. */
export const boardPriorsSchema = z.record(z.string().max(64), z.number().min(0).max(1));

export const boardSectionRefSchema = z.object({
  id,
  template: z.string().min(1).max(64),
  params: z.record(z.string(), z.union([siValue, z.string(), z.boolean()])).default({}),
  side: boardSideSchema,
  title: z.string().max(200),
  touchesBus: z.boolean().default(false),
});

export const boardPartPinSchema = z.object({ pin: z.string().max(16), net: z.string().max(64) });

export const boardPartSchema = z.object({
  designator: z.string().min(1).max(32),
  /** The top-level netlist element that models this part ("R101", "XU201"); absent for parts not in the netlist. */
  element: z.string().max(32).optional(),
  kind: boardPartKindSchema,
  value: z.string().max(64),
  /** Nominal value in SI units where it has one (ohms, farads, volts for a zener/regulator). */
  nominal: siValue.optional(),
  /** Relative tolerance (0.05 = ±5 %). */
  tolerance: z.number().min(0).max(1).optional(),
  package: z.string().max(32),
  marking: z.string().max(64).optional(),
  x: coord,
  y: coord,
  rotation: boardNumber(BOUNDS.rotation, 'a rotation', 'degrees').default(0),
  section: z.string().max(64),
  side: boardSideSchema.optional(),
  pins: z.array(boardPartPinSchema).default([]),
  /** Extra part parameters, e.g. an opto-coupler's CTR or a motor's pulses per revolution. */
  params: z.record(z.string(), z.union([siValue, z.string()])).optional(),
  /** This part's own fault-mode priors, where the shop knows better than the kind's defaults. */
  priors: boardPriorsSchema.optional(),
});
export type BoardPart = z.infer<typeof boardPartSchema>;

export const boardNetSchema = z.object({
  name: z.string().min(1).max(64),
  label: z.string().max(200),
  side: boardSideSchema,
  /** The net a meter's black probe goes on for readings of this net. */
  reference: z.string().max(64),
});

export const boardConnectorSchema = z.object({
  name: z.string().min(1).max(32),
  x: coord,
  y: coord,
  title: z.string().max(200).optional(),
  pins: z.array(z.object({ pin: z.string().max(16), net: z.string().max(64), function: z.string().max(200) })),
});

export const boardTestPointSchema = z.object({
  id: z.string().regex(/^TP\d+$/),
  label: z.string().max(200),
  net: z.string().max(64),
  reference: z.string().max(64),
  x: coord,
  y: coord,
  powerStates: z.array(boardPowerStateSchema).min(1),
  modes: z.array(boardMeterModeSchema).min(1),
  section: z.string().max(64),
  touchesBus: z.boolean(),
  side: boardSideSchema.optional(),
  /** Where the healthy band of the powered reading comes from, when a standard or datasheet fixes it. */
  band: z.object({ low: voltsSchema, high: voltsSchema, source: z.string().max(400) }).optional(),
});
export type BoardTestPoint = z.infer<typeof boardTestPointSchema>;

export const boardFaultCodeSchema = z.object({
  code: z.string().min(1).max(32),
  meaning: z.string().max(400),
  suspectSections: z.array(z.string().max(64)),
  /** Likelihood ratio per suspect section (the rule beside the contract's FAULT_CODE_WEIGHT); absent sections take the default. */
  weights: z.record(z.string().max(64), z.number().min(1).max(50)).optional(),
});

export const boardMotorSchema = z.object({
  connector: z.string().max(32).optional(),
  pulsesPerRevolution: boardNumber(BOUNDS.pulsesPerRevolution, 'pulses per revolution').int(),
  /** Netlist elements that model the off-board motor; lifted (unplugged) for unpowered readings. */
  elements: z.array(z.string().max(32)).default([]),
  note: z.string().max(400).optional(),
});

export const boardModelSchema = z.object({
  schemaVersion: z.literal(BOARD_MODEL_SCHEMA_VERSION),
  id: z.string().min(1).max(64),
  slug: z
    .string()
    .regex(/^[a-z0-9][a-z0-9-]*$/)
    .max(64),
  name: z.string().min(1).max(200),
  family: z.string().max(200),
  maker: z.string().max(200),
  description: z.string().max(4000).optional(),
  picture: boardPictureSchema,
  /** Composed from templates, or empty when the model is plain SPICE plus metadata. */
  sections: z.array(boardSectionRefSchema).default([]),
  /** The composed (or pasted) SPICE-subset netlist. */
  netlist: z.string().min(1).max(500_000),
  /** Default .param values used for powered readings (e.g. FAN_ON, DUTY). */
  params: z.record(z.string(), siValue).default({}),
  parts: z.array(boardPartSchema),
  nets: z.array(boardNetSchema),
  connectors: z.array(boardConnectorSchema).default([]),
  testPoints: z.array(boardTestPointSchema),
  faultCodes: z.array(boardFaultCodeSchema).default([]),
  motor: boardMotorSchema.optional(),
  cautions: z.array(z.string().max(1000)).default([]),
  /**
   * The section list and layout the model was composed from (the board library's BoardSpec), kept so the board
   * editor can change a section and compose again. Absent for a model written as plain SPICE plus metadata.
   */
  composition: z.record(z.string(), z.unknown()).optional(),
});
export type BoardModel = z.infer<typeof boardModelSchema>;
export type BoardModelInput = z.input<typeof boardModelSchema>;
