import { z } from 'zod';
import type { Role } from './auth';
import { idSchema, isoDateTime, optionalText } from './common';
import { hasRole, ROLES } from './policy';

/**
 * Board capture: what a technician marks on a board's photo — test points, connectors with their pins, and
 * sections (a region of the photo recognised as one of the shared templates, with the part values read off the
 * board and the board nets its ports meet). It is the draft a board model is composed from: saving it has the
 * engine compute the expected values of every point on a modelled net; publishing it makes a board-model version.
 * Coordinates are photo pixels, origin top left.
 */
const netName = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9_.+-]+$/, 'a net name is letters, digits and _ . + -')
  .max(64);
const coord = z.number().finite().min(0).max(100_000);

export const captureRegionSchema = z.object({ x: coord, y: coord, w: z.number().positive().max(100_000), h: z.number().positive().max(100_000) });

export const capturePointSchema = z.object({
  id: z.string().regex(/^TP\d{1,4}$/),
  label: z.string().trim().max(200).default(''),
  x: coord,
  y: coord,
  /** The board net the point sits on (one a section's port is named to, or a template net such as "reg15_vin"). */
  net: netName.optional(),
});
export type CapturePoint = z.infer<typeof capturePointSchema>;

export const captureConnectorSchema = z.object({
  name: z
    .string()
    .trim()
    .regex(/^[A-Z]{1,4}\d{0,4}$/, 'a connector name as printed, e.g. CN3')
    .max(16),
  title: z.string().trim().max(200).optional(),
  x: coord,
  y: coord,
  pins: z
    .array(
      z.object({ pin: z.string().trim().min(1).max(16), net: z.union([netName, z.literal('')]).default(''), function: z.string().trim().max(200).default('') }),
    )
    .max(64),
});
export type CaptureConnector = z.infer<typeof captureConnectorSchema>;

/** Templates a captured section may use: the shared section templates of the board library. */
export const captureTemplates = ['dc-bus', 'regulator-15v', 'regulator-5v', 'fan-switch', 'speed-command', 'speed-feedback', 'thermistor-sense'] as const;
export const captureTemplateSchema = z.enum(captureTemplates);

export const captureSectionSchema = z.object({
  id: z
    .string()
    .trim()
    .regex(/^[a-z][a-z0-9-]{0,31}$/, 'a section id is lower-case letters, digits and -'),
  template: captureTemplateSchema,
  title: z.string().trim().max(200).optional(),
  /** Designator base: 100 → R101, C101 … */
  base: z.number().int().min(0).max(9900),
  region: captureRegionSchema,
  /** Template port → board net (e.g. { out: "v15" }): sections meet where they name the same net. */
  nets: z.record(z.string().max(32), netName).default({}),
  params: z.record(z.string().max(32), z.union([z.number().finite(), z.string().max(64), z.boolean()])).default({}),
  /** Designator → value in ohms or farads, decoded from what is printed on the part. */
  values: z.record(z.string().max(32), z.number().positive().finite()).default({}),
  /** Designator → the marking as typed ("473J", "brown black orange gold", "470µF 400V"). */
  markings: z.record(z.string().max(32), z.string().max(64)).default({}),
});
export type CaptureSection = z.infer<typeof captureSectionSchema>;

export const boardCaptureSchema = z.object({
  photo: z.object({ uploadId: idSchema, width: z.number().positive(), height: z.number().positive() }),
  points: z.array(capturePointSchema).max(500).default([]),
  connectors: z.array(captureConnectorSchema).max(50).default([]),
  sections: z.array(captureSectionSchema).max(40).default([]),
});
export type BoardCapture = z.infer<typeof boardCaptureSchema>;
export type BoardCaptureInput = z.input<typeof boardCaptureSchema>;

/** What a saved draft gives each point: its expected values where it lands on a modelled net, or why not. */
export const capturePointResultSchema = z.object({
  id: z.string(),
  /** Expected rows of this point (powered DC V, unpowered Ω / diode / continuity), from the engine. */
  expected: z.array(
    z.object({
      mode: z.enum(['dcv', 'ohm', 'diode', 'continuity']),
      power: z.enum(['on', 'off']),
      expected: z.union([z.number(), z.literal('OL'), z.boolean()]),
      low: z.number().nullable(),
      high: z.number().nullable(),
      unit: z.enum(['V', 'ohm']),
      source: z.string().optional(),
    }),
  ),
  /** Why there is no expected value: no net named, or a net no section models. */
  unmodelled: z.string().optional(),
});

export const boardDraftSchema = z.object({
  boardId: idSchema,
  capture: boardCaptureSchema,
  savedAt: isoDateTime,
  savedByName: z.string().nullable(),
  /** The composed model's check: null when the draft composes and solves; otherwise what is wrong, in words. */
  problem: z.string().nullable(),
  points: z.array(capturePointResultSchema),
  /** Board nets the sections model, for binding points (label as the template words it). */
  nets: z.array(z.object({ name: z.string(), label: z.string() })),
  /** The composed netlist, for the advanced view. */
  netlist: z.string().nullable(),
  /** Whether the board's newest published version has a model (sections) or is its photo only. */
  publishedModel: z.boolean(),
});
export type BoardDraft = z.infer<typeof boardDraftSchema>;

export const saveDraftRequest = z.object({ capture: boardCaptureSchema });
export const publishDraftRequest = z.object({ note: optionalText(500) });

/** A board-model version that is its photo only (taken in before it had a model): nothing on it is judged. */
export const isPhotoOnlyBoard = (doc: { sections: readonly unknown[]; parts: readonly unknown[] }) => doc.sections.length === 0 && doc.parts.length === 0;

/** Intake of a board the library does not hold yet: its maker and model as printed, and its photos. */
export const createUnlistedBoardRequest = z.object({
  maker: z.string().trim().min(1).max(100),
  model: z.string().trim().min(1).max(100),
  /** The photo that becomes the board's picture, with its size in pixels (the capture's coordinates). */
  photo: z.object({ uploadId: idSchema, width: z.number().int().positive().max(20_000), height: z.number().int().positive().max(20_000) }),
});
export type CreateUnlistedBoardRequest = z.infer<typeof createUnlistedBoardRequest>;

/**
 * Who does what with a capture: the bench takes in unlisted boards and marks them (saving drafts); a lead publishes
 * a model, as editing one in the library is a lead's. The server's routes and the screens both read these.
 */
export const CAPTURE_ROLES = { intake: ROLES.bench, mark: ROLES.bench, publish: ROLES.reviewers } as const;
export const canMarkBoards = (role: Role | null | undefined) => hasRole(role, CAPTURE_ROLES.mark);
export const canPublishBoards = (role: Role | null | undefined) => hasRole(role, CAPTURE_ROLES.publish);
