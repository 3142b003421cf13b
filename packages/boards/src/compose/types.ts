import type { BoardModel, BoardPart, BoardPartKind, BoardSide } from '@splitscope/contract';
import type { NetInfo, ParamValue, TestPointSuggestion } from '../sections/types';

/** A rectangle on the board picture (picture units, origin top left). */
export interface Region {
  x: number;
  y: number;
  w: number;
  h: number;
}

interface SectionBase {
  /** Section id on the board ("bus", "fan-switch"); template nodes are prefixed with it. */
  id: string;
  title?: string;
  /** Where the section's parts sit on the picture; parts fill it row by row unless placed explicitly. */
  region: Region;
  /** Explicit positions for some parts (designator → centre). */
  place?: Record<string, { x: number; y: number; rotation?: number }>;
}

/** A section made from one of the shared templates. */
export interface TemplateSectionInstance extends SectionBase {
  template: string;
  /** Designator base: 400 → R401, C401 … */
  base: number;
  /** Board net names for the template's ports ({ out: 'v15', hotGnd: '0' }). */
  nets?: Record<string, string>;
  params?: Record<string, ParamValue>;
  /**
   * Part values read off the board (designator → ohms or farads), replacing the template's defaults for resistors
   * and capacitors; `markings` keeps what was printed on each part, as typed.
   */
  values?: Record<string, number>;
  markings?: Record<string, string>;
}

/**
 * A section written as plain SPICE element lines (for people who already have a netlist). Parts are read from
 * the element lines; elements listed in `offBoard` stand for things behind a connector (mains, the motor).
 */
export interface SpiceSectionInstance extends SectionBase {
  spice: string;
  side: BoardSide;
  touchesBus: boolean;
  offBoard?: string[];
  /** Part kinds the element letter cannot tell (an X instance that is a regulator, an R that is a thermistor). */
  kinds?: Record<string, BoardPartKind>;
  nets?: NetInfo[];
  testPoints?: TestPointSuggestion[];
}

export type SectionInstance = TemplateSectionInstance | SpiceSectionInstance;

/** A test point chosen for the board: a stable id on a net, placed beside a part (default: the first part on the net). */
export interface TestPointChoice {
  id: string;
  net: string;
  label?: string;
  section?: string;
  near?: string;
}

export interface ConnectorSpec {
  name: string;
  x: number;
  y: number;
  title?: string;
  pins: { pin: string; net: string; function: string }[];
}

export interface BoardSpec {
  id: string;
  slug: string;
  name: string;
  family: string;
  maker: string;
  description?: string;
  /** Picture size in px; the picture is drawn from the layout unless an svg is given. */
  width: number;
  height: number;
  svg?: string;
  /** Solder-mask and silkscreen colours of the drawn picture. */
  colours?: { mask: string; silk: string; copper: string };
  /** Silkscreen text in the corner of the drawn picture ("FJORDLINE IDF-310 rev A"). */
  silkTitle?: string;
  sections: SectionInstance[];
  /** Shared lines a SPICE-written board needs before its sections (.param, .model, .subckt). */
  header?: string;
  /** Microcontroller ground; when a section uses it, an isolation resistor gives it a DC path to bus negative. */
  coldGround?: string;
  /** Test points by id; default: every template suggestion, numbered TP1… in section order. */
  testPoints?: TestPointChoice[];
  connectors?: ConnectorSpec[];
  faultCodes?: BoardModel['faultCodes'];
  motor?: BoardModel['motor'];
  cautions?: string[];
  /** Fault-mode priors per designator, copied onto the parts. */
  priors?: Record<string, NonNullable<BoardModel['parts'][number]['priors']>>;
  /** .param overrides for powered readings (FAN_ON, DUTY …). */
  params?: Record<string, number>;
}

export type { BoardPart };
