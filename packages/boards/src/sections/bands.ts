/**
 * Healthy bands of the main powered readings, each with its source. Shared by the templates and by boards
 * written as plain SPICE, so one band means one thing everywhere.
 */
export interface SourcedBand {
  low: number;
  high: number;
  source: string;
}

/** Bridge diode forward drop at light load, used in the bus band (common practice). */
export const BRIDGE_VF = 0.8;

/** DC bus of a capacitor-input bridge at light load: √2·Vrms − 2·VF over the mains tolerance. */
export function busBand(mainsRms: number, tolerance: number): SourcedBand {
  return {
    low: Math.SQRT2 * mainsRms * (1 - tolerance) - 2 * BRIDGE_VF,
    high: Math.SQRT2 * mainsRms * (1 + tolerance) - 2 * BRIDGE_VF,
    source:
      `computed: Vdc ≈ √2·Vrms − 2·VF (VF ${BRIDGE_VF} V, common practice) for ${mainsRms} V ±${Math.round(tolerance * 100)} % mains; ` +
      'a capacitor-input bridge at light load charges to the line peak (Power Integrations AN-17). A loaded board sits lower, about 280–320 V (common practice, from memory).',
  };
}

export const RAIL_15V: SourcedBand = {
  low: 14.25,
  high: 15.75,
  source: 'onsemi MC7800 series datasheet, MC7815C electrical characteristics: VO 14.25–15.75 V over 5 mA–1 A, Vin 17.5–30 V',
};

export const RAIL_5V: SourcedBand = {
  low: 4.75,
  high: 5.25,
  source: 'LM78xx datasheet (Fairchild DS400018), LM7805: VO 4.75–5.25 V over load/line/temperature',
};

export const REG15_INPUT: SourcedBand = {
  low: 17.5,
  high: 30,
  source: 'onsemi MC7800 series datasheet, MC7815C: output band specified for Vin 17.5–30 V',
};

export const REG5_INPUT: SourcedBand = {
  low: 7,
  high: 25,
  source:
    'computed: 5 V + 2.0 V typical dropout (onsemi MC7800 series datasheet); upper limit 25 V chosen below the 35 V absolute maximum (LM78xx datasheet, Fairchild DS400018)',
};

export const SWITCHED_15V: SourcedBand = {
  low: 13.9,
  high: 15.75,
  source: 'computed: 15 V rail band 14.25–15.75 V (onsemi MC7800 series datasheet, MC7815C) less a saturated PNP drop of up to 0.35 V (common practice)',
};

export const SPEED_COMMAND: SourcedBand = {
  low: 1,
  high: 7,
  source: 'speed-command inputs of DC fan motors with built-in drivers span roughly 1–7 V (common practice, from memory)',
};
