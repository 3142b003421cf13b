import type { BoardPart, BoardSide, BoardMeterMode } from '@splitscope/contract';

export type ParamValue = number | string | boolean;

/** What a section template needs from the board: its id, designator base, shared net names and params. */
export interface SectionContext {
  /** Section id on the board ("bus", "fan-switch"); internal nodes are prefixed with it. */
  id: string;
  /** Designator base: 100 → R101, C101 … */
  base: number;
  /** Board net names for the template's ports (e.g. { out: 'v15', hotGnd: '0' }). */
  nets: Record<string, string>;
  params: Record<string, ParamValue>;
}

export interface TemplatePart extends Omit<BoardPart, 'x' | 'y' | 'rotation' | 'section' | 'pins'> {
  pins: { pin: string; net: string }[];
}

export interface TestPointSuggestion {
  label: string;
  net: string;
  reference: string;
  powerStates: ('on' | 'off')[];
  modes: BoardMeterMode[];
  /** Healthy band of the powered reading with its source, when one is fixed by a standard/datasheet. */
  band?: { low: number; high: number; source: string };
}

export interface NetInfo {
  name: string;
  label: string;
  side: BoardSide;
  reference: string;
}

export interface SectionOutput {
  template: string;
  title: string;
  side: BoardSide;
  touchesBus: boolean;
  /** SPICE-subset lines for this section (elements only; shared .model/.subckt come from the library). */
  netlist: string;
  parts: TemplatePart[];
  nets: NetInfo[];
  testPoints: TestPointSuggestion[];
  /** .param defaults the section's sources use. */
  params: Record<string, number>;
  /** Netlist elements that model things off the board (the motor, the microcontroller's pins, supplies on a cable). */
  externals: { element: string; description: string; motor?: boolean }[];
  /** Subcircuit/model names this section uses (from the shared library). */
  uses: string[];
}

export type SectionTemplate = (ctx: SectionContext) => SectionOutput;
