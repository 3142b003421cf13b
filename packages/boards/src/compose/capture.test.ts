// A board captured on its photo: a DC bus, a 15 V regulator and an opto-driven fan switch marked as template
// sections with values typed from their markings, six test points. The engine gives the points on modelled nets
// their expected values; the rails are checked against bands that name their source.
import type { BoardCapture } from '@splitscope/contract';
import { describe, expect, it } from 'vitest';
import { expectedReadings, type ExpectedReading } from '../readings/expected';
import { decodeMarking } from '../references/decode-marking';
import { composeCapture } from './capture';

const meta = { id: 'captured-1', slug: 'captured-1', name: 'Captured test board', family: '', maker: 'Invented maker' };
const region = (x: number, y: number) => ({ x, y, w: 300, h: 200 });
const capture = (over: Partial<BoardCapture> = {}): BoardCapture => ({
  photo: { uploadId: 'photo-1', width: 2000, height: 1500 },
  connectors: [{ name: 'CN5', x: 40, y: 1400, pins: [{ pin: '3', net: 'v15sw', function: '15 V to the motor' }] }],
  sections: [
    {
      id: 'bus',
      template: 'dc-bus',
      base: 100,
      region: region(0, 0),
      nets: { bus: 'vbus' },
      params: { mainsRms: 230 },
      values: { C101: decodeMarking('electrolytic-capacitor', '470µF 400V').nominal, R101: decodeMarking('resistor', 'brown green yellow gold').nominal },
      markings: { C101: '470µF 400V', R101: 'brown green yellow gold' },
    },
    { id: 'reg15', template: 'regulator-15v', base: 200, region: region(400, 0), nets: { out: 'v15' }, params: {}, values: {}, markings: {} },
    {
      id: 'fan-switch',
      template: 'fan-switch',
      base: 300,
      region: region(0, 400),
      nets: { in: 'v15', out: 'v15sw' },
      params: {},
      values: { R303: decodeMarking('resistor', '103').nominal, R302: decodeMarking('resistor', '472').nominal },
      markings: { R303: '103', R302: '472' },
    },
  ],
  points: [
    { id: 'TP1', label: 'Bus +', x: 120, y: 80, net: 'vbus' },
    { id: 'TP2', label: '', x: 180, y: 90, net: 'bus_mid' },
    { id: 'TP3', label: 'U201 in', x: 450, y: 60, net: 'reg15_vin' },
    { id: 'TP4', label: '15 V', x: 520, y: 60, net: 'v15' },
    { id: 'TP5', label: 'Motor 15 V', x: 60, y: 450, net: 'v15sw' },
    { id: 'TP6', label: 'Q301 base', x: 90, y: 470, net: 'fan-switch_b' },
    { id: 'TP7', label: 'unknown pad', x: 900, y: 900 },
  ],
  ...over,
});
const dcv = (rows: ExpectedReading[], tp: string) => rows.find((r) => r.testPoint === tp && r.mode === 'dcv' && r.power === 'on')!.expected as number;

describe('composeCapture', () => {
  const out = composeCapture(capture(), meta);
  const rows = expectedReadings(out.model!);

  it('composes the three sections, keeps the photo as the picture and each point where it was placed', () => {
    expect(out.problem).toBeNull();
    expect(out.model!.picture).toEqual({ uploadId: 'photo-1', width: 2000, height: 1500, units: 'px' });
    expect(out.model!.testPoints.map((t) => [t.id, t.x, t.y])).toEqual([
      ['TP1', 120, 80],
      ['TP2', 180, 90],
      ['TP3', 450, 60],
      ['TP4', 520, 60],
      ['TP5', 60, 450],
      ['TP6', 90, 470],
    ]);
    expect(out.unmodelled).toEqual({ TP7: 'no net named for this point' });
    expect(out.model!.parts.find((p) => p.designator === 'C101')).toMatchObject({ nominal: 470e-6, marking: '470µF 400V' });
  });

  it('DC bus within 230 V ±10 % less two bridge drops: 291.1–356.2 V (Power Integrations AN-17; VF common practice)', () => {
    expect(dcv(rows, 'TP1')).toBeGreaterThan(291.1);
    expect(dcv(rows, 'TP1')).toBeLessThan(356.2);
  });
  it('the typed 150 kΩ bleeder pair divides the bus at its midpoint, loaded by the 10 MΩ meter (divider rule, computed)', () => {
    const lower = (150e3 * 10e6) / (150e3 + 10e6);
    expect(dcv(rows, 'TP2')).toBeCloseTo((dcv(rows, 'TP1') * lower) / (150e3 + lower), 1);
  });
  it('15 V rail within 14.25–15.75 V (onsemi MC7800 series datasheet, MC7815C); its input above it by at least the 2 V dropout', () => {
    expect(dcv(rows, 'TP4')).toBeGreaterThanOrEqual(14.25);
    expect(dcv(rows, 'TP4')).toBeLessThanOrEqual(15.75);
    expect(dcv(rows, 'TP3') - dcv(rows, 'TP4')).toBeGreaterThanOrEqual(2);
  });
  it('switched 15 V within 13.9–15.75 V: the 15 V band less a saturated PNP drop (computed, common practice)', () => {
    expect(dcv(rows, 'TP5')).toBeGreaterThanOrEqual(13.9);
    expect(dcv(rows, 'TP5')).toBeLessThanOrEqual(15.75);
    // Switch on: the PNP base sits about one VBE (0.6–0.8 V, common practice) below its emitter.
    expect(dcv(rows, 'TP4') - dcv(rows, 'TP6')).toBeGreaterThan(0.5);
  });
  it('typed values reach the netlist: a 1 kΩ base resistor in place of 4.7 kΩ moves the base voltage', () => {
    const c = capture();
    c.sections[2]!.values = { ...c.sections[2]!.values, R302: 1e3 };
    const other = composeCapture(c, meta);
    expect(other.model!.netlist).toMatch(/^R302 \S+ \S+ 1000$/m);
    expect(dcv(expectedReadings(other.model!), 'TP6')).not.toBeCloseTo(dcv(rows, 'TP6'), 2);
  });
  it('a point on a net no section models is recorded, not judged; no section at all gives no model', () => {
    const c = capture();
    c.points[6]!.net = 'somewhere';
    expect(composeCapture(c, meta).unmodelled.TP7).toMatch(/not on any marked section/);
    const empty = composeCapture(capture({ sections: [] }), meta);
    expect(empty.model).toBeNull();
    expect(Object.keys(empty.unmodelled)).toHaveLength(7);
  });
  it('a value typed for a part the template does not have is a problem in words, not a crash', () => {
    const c = capture();
    c.sections[1]!.values = { R999: 100 };
    expect(composeCapture(c, meta).problem).toMatch(/no part R999/);
  });
});
