// Invented control-side board sections: opto-coupled fan switch, speed command and feedback (controller side
// isolated: its ground GC reaches bus negative only through 1 GΩ), thermistor input and relay driver.
import { OPTO_SUBCKT, tp, type BenchBoard } from './board';

// Sections written once and used by B04–B06 alone and by B12 together. The controller side: its own 5 V on GC.
export const COLD_SIDE = `VCC vcc gc DC 5
RISO gc 0 1g`;
export const SWITCHED_SUPPLY = `V15 s15 0 DC 15
RF401 s15 v15 4.7
C400 v15 0 47u`;
export const SIGNAL_MODELS = `.model QSW PNP(is=2e-14 bf=80)
.model DSF D(is=2.5e-9 n=1.75)
.model QNF NPN(is=1e-14 bf=150)
.model DSG D(is=2e-9 n=1.9)
${OPTO_SUBCKT}`;

export const fanSwitch = (on: number) => `VPIN pin gc DC ${5 * on}
R401 pin la 390
XU401 la gc oc 0 OPTOC
R402 oc b4 2.2k
R403 v15 b4 10k
Q401 vf b4 v15 QSW
D401 0 vf DSF
C401 vf 0 22u
C402 vf 0 100n
R404 vf 0 10k
RMOT401 vf 0 1.2k`;

// The controller's PWM pin is written as its average (duty × 5 V): the DC model a meter's reading follows.
export const speedCommand = (duty: number, led: string) => `VPWM pwm gc DC ${5 * duty}
R501 pwm ${led} 680
XU501 ${led} gc pc 0 OPTOC
R502 v15 pc 4.7k
R503 pc f1 10k
C501 f1 0 1u
Q501 v15 f1 e5 QNF
R504 e5 vsp 1k
R505 vsp 0 10k
C502 vsp 0 1u`;

// RFG601 stands for the motor's open-collector speed output in its low state (off-board).
export const feedback = (supply: string) => `R601 ${supply} fa 3.3k
XU601 fa fg fo gc OPTOC
RFG601 fg 0 220
R602 vcc fo 10k
R603 fo fin 1k
C601 fin gc 1n
R604 fin gc 100k
D601 fin vcc DSG
D602 gc fin DSG`;

export const B04_FAN_SWITCH: BenchBoard = {
  id: 'B04',
  title: 'opto-driven PNP high-side switch for the fan motor supply',
  defaults: { FANON: 1 },
  kindOverrides: { XU401: 'opto-coupler' },
  netlist: (p) => `* B04 fan motor control supply switched by an opto-driven PNP (invented)
${SIGNAL_MODELS}
${SWITCHED_SUPPLY}
${COLD_SIDE}
${fanSwitch(p.FANON ?? 1)}
.end`,
  testPoints: [tp('TP1', 'v15'), tp('TP2', 'vf'), tp('TP3', 'b4'), tp('TP4', 'oc'), tp('TP5', 'la', 'gc'), tp('TP6', 'vcc', 'gc'), tp('CN4-1', 's15')],
};

export const B05_SPEED_CMD: BenchBoard = {
  id: 'B05',
  title: 'opto-isolated speed command, PWM averaged to DC',
  defaults: { DUTY: 0.5 },
  kindOverrides: { XU501: 'opto-coupler' },
  netlist: (p) => `* B05 opto-isolated speed command, PWM averaged to a DC level (invented)
${SIGNAL_MODELS}
V15 v15 0 DC 15
${COLD_SIDE}
${speedCommand(p.DUTY ?? 0.5, 'la')}
.end`,
  testPoints: [tp('TP1', 'v15'), tp('TP2', 'pc'), tp('TP3', 'f1'), tp('TP4', 'vsp'), tp('TP5', 'la', 'gc'), tp('TP6', 'e5')],
};

export const B06_FEEDBACK: BenchBoard = {
  id: 'B06',
  title: 'motor speed feedback through an opto-coupler',
  defaults: {},
  kindOverrides: { XU601: 'opto-coupler' },
  netlist: () => `* B06 motor speed feedback through an opto-coupler (invented)
${SIGNAL_MODELS}
V15 v15 0 DC 15
${COLD_SIDE}
${feedback('v15')}
.end`,
  testPoints: [tp('TP1', 'v15'), tp('TP2', 'fa'), tp('TP3', 'fg'), tp('TP4', 'fo', 'gc'), tp('TP5', 'fin', 'gc'), tp('TP6', 'vcc', 'gc')],
};

export const B07_THERMISTOR: BenchBoard = {
  id: 'B07',
  title: 'coil thermistor divider into an ADC input with clamps',
  defaults: {},
  // RTH701 is the coil thermistor on its connector (10 kΩ at 25 °C), written at that temperature.
  netlist: () => `* B07 coil thermistor divider into an ADC input with clamp diodes (invented)
.model DSG D(is=2e-9 n=1.9)
VCC vcc 0 DC 5
R701 vcc th 10k
RTH701 th 0 10k
C702 th 0 10n
R702 th adc 2.2k
C701 adc 0 100n
D701 adc vcc DSG
D702 0 adc DSG
R703 vcc ref 10k
R704 ref 0 10k
.end`,
  testPoints: [tp('TP1', 'vcc'), tp('TP2', 'th'), tp('TP3', 'adc'), tp('TP4', 'ref')],
};

export const B08_RELAY: BenchBoard = {
  id: 'B08',
  title: 'relay driver with flyback diode and indicator',
  defaults: { RLY: 1 },
  kindOverrides: { D803: 'led' },
  // RK801 is the relay coil's DC resistance (the coil is off the meter's DC reach as an inductance).
  netlist: (p) => `* B08 relay driver with flyback diode and an indicator LED (invented)
.model QND NPN(is=1e-14 bf=200)
.model DSF D(is=2.5e-9 n=1.75)
.model DIND D(is=1e-20 n=1.9)
V12 v12 0 DC 12
VIO pin 0 DC ${5 * (p.RLY ?? 1)}
R801 pin b8 4.7k
R802 b8 0 22k
Q801 rc b8 0 QND
RK801 v12 rc 270
D801 rc v12 DSF
R803 v12 led8 2.2k
D803 led8 rc DIND
.end`,
  testPoints: [tp('TP1', 'v12'), tp('TP2', 'rc'), tp('TP3', 'b8'), tp('TP4', 'pin'), tp('TP5', 'led8')],
};
