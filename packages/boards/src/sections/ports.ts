/**
 * What the board capture asks of each template: its name in the bench's words and the ports a technician names
 * nets for (where sections meet). Grounds keep their defaults (bus negative "0", controller ground "gnd_c"); a
 * port left empty keeps the template's default net. Defaults are the ones in templates.ts.
 */
export interface TemplatePort {
  port: string;
  label: string;
  default: string;
}

export interface TemplateInfo {
  template: string;
  /** The section id a new section of this template gets (its internal nets are prefixed with it). */
  sectionId: string;
  title: string;
  ports: TemplatePort[];
}

export const TEMPLATE_INFO: TemplateInfo[] = [
  { template: 'dc-bus', sectionId: 'bus', title: 'DC bus (bridge, bulk capacitor, bleeder)', ports: [{ port: 'bus', label: 'DC bus +', default: 'vbus' }] },
  { template: 'regulator-15v', sectionId: 'reg15', title: '15 V regulator (78xx)', ports: [{ port: 'out', label: '15 V rail', default: 'v15' }] },
  {
    template: 'regulator-5v',
    sectionId: 'reg5',
    title: '5 V regulator (78xx, controller side)',
    ports: [{ port: 'out', label: '5 V rail', default: 'vcc5_c' }],
  },
  {
    template: 'fan-switch',
    sectionId: 'fan-switch',
    title: 'Opto-driven high-side switch (fan 15 V)',
    ports: [
      { port: 'in', label: '15 V in', default: 'v15' },
      { port: 'out', label: 'Switched 15 V out', default: 'v15sw' },
      { port: 'coldVcc', label: 'Controller 5 V', default: 'vcc5_c' },
    ],
  },
  {
    template: 'speed-command',
    sectionId: 'speed-cmd',
    title: 'Opto speed command (Vsp)',
    ports: [
      { port: 'supply', label: 'Supply', default: 'v15sw' },
      { port: 'out', label: 'Speed command out', default: 'vsp' },
    ],
  },
  {
    template: 'speed-feedback',
    sectionId: 'speed-fb',
    title: 'Speed feedback (FG)',
    ports: [
      { port: 'supply', label: 'Supply', default: 'v15sw' },
      { port: 'fg', label: 'FG line', default: 'fg' },
      { port: 'coldVcc', label: 'Controller 5 V', default: 'vcc5_c' },
    ],
  },
  {
    template: 'thermistor-sense',
    sectionId: 'thermistor',
    title: 'Thermistor input',
    ports: [
      { port: 'sensor', label: 'Sensor line', default: '' },
      { port: 'coldVcc', label: 'Controller 5 V', default: 'vcc5_c' },
    ],
  },
];
