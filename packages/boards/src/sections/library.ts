/**
 * Shared device models and subcircuits for the section templates.
 * Parameter sources: PC817 opto-coupler (Sharp datasheet): VF 1.2 V typ at 20 mA, CTR 50–600 %; 78xx regulators
 * (onsemi MC7800 series datasheet): 2.0 V typical dropout. Diode and BJT parameters are generic small-signal /
 * rectifier values (from memory), good enough for DC operating points and meter readings.
 */

/** LED of the opto-coupler: N = 2, IS fitted so VF ≈ 1.2 V at 20 mA (PC817 datasheet typical) [computed]. */
export const OPTO_LED_IS = 20e-3 / Math.exp(1.2 / (2 * 0.025852));
/** Current transfer ratio used by the demo boards: 130 %, within PC817 rank A/B (80–160 / 130–260 %, Sharp datasheet). */
export const OPTO_CTR = 1.3;
const PHOTO_BF = 200;

export const MODELS: Record<string, string> = {
  DRECT: '.model DRECT D(IS=1e-9 N=1.8 RS=0.04)',
  DSIG: '.model DSIG D(IS=4e-9 N=1.9 RS=0.6)',
  DLED_R: '.model DLED_R D(IS=1e-18 N=1.9 RS=10)',
  DZ8V2: '.model DZ8V2 D(IS=1e-14 N=1 BV=8.2 IBV=1m)',
  QNPN: '.model QNPN NPN(IS=1e-14 BF=200 BR=3)',
  QPNP: '.model QPNP PNP(IS=1e-14 BF=150 BR=3)',
};

/**
 * Opto-coupler: LED (anode a, cathode k) with a 0 V sense source; the phototransistor (collector c, emitter e) gets a
 * base current CTR/(BF+1)·IF from a CCCS, so its collector current is CTR·IF until it saturates.
 */
export const OPTO_SUBCKT = [
  `.subckt OPTO a k c e`,
  `VS a an 0`,
  `DL an k DOPTO`,
  `FP c b VS ${(OPTO_CTR / (PHOTO_BF + 1)).toPrecision(6)}`,
  `QP c b e QPHOTO`,
  `.model DOPTO D(IS=${OPTO_LED_IS.toPrecision(4)} N=2 RS=1)`,
  `.model QPHOTO NPN(IS=1e-14 BF=${PHOTO_BF} BR=2)`,
  `.ends OPTO`,
].join('\n');

/**
 * 78xx-style regulator: a zener reference drives a Darlington pass pair (the 78xx pass element is a Darlington —
 * from memory), so the output sits at BV − 2·VBE and follows the input down once Vin − Vout falls below about
 * 1.5–2 V (MC7800 series datasheet: 2.0 V typical dropout at 1 A). The bias resistor draws a few mA like the
 * datasheet's quiescent current (3.5 mA typ for MC7815C).
 */
export function regulatorSubckt(name: string, vout: number): string {
  const bv = vout + 1.3;
  return [
    `.subckt ${name} in out com`,
    `RB in b 2.2k`,
    `DZ com b DZREF`,
    `Q1 in b m QPASS`,
    `RM m out 4.7k`,
    `Q2 in m out QPASS`,
    `RQ out com 20k`,
    `.model DZREF D(IS=1e-14 N=1 BV=${bv.toFixed(3)} IBV=1m)`,
    `.model QPASS NPN(IS=1e-14 BF=100 BR=1)`,
    `.ends ${name}`,
  ].join('\n');
}

export const SUBCKTS: Record<string, () => string> = {
  OPTO: () => OPTO_SUBCKT,
  REG7815: () => regulatorSubckt('REG7815', 15),
  REG7805: () => regulatorSubckt('REG7805', 5),
};
