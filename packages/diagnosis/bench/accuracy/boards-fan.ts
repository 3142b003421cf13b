// B12: the three opto-coupled stages of B04–B06 on one board, as an outdoor fan drive has them: one isolated
// controller side (own 5 V on GC, 1 GΩ to bus negative) driving the motor-supply switch and the speed command, and
// reading the speed feedback, whose LED hangs on the switched supply. Over 40 parts: pairs are not cheap here.
import { tp, type BenchBoard } from './board';
import { COLD_SIDE, SIGNAL_MODELS, SWITCHED_SUPPLY, fanSwitch, feedback, speedCommand } from './boards-signal';

export const B12_FAN_DRIVE: BenchBoard = {
  id: 'B12',
  title: 'fan drive: supply switch, speed command and feedback on one isolated controller side',
  defaults: { FANON: 1, DUTY: 0.5 },
  kindOverrides: { XU401: 'opto-coupler', XU501: 'opto-coupler', XU601: 'opto-coupler' },
  netlist: (p) => `* B12 outdoor fan drive with three opto-couplers and an isolated controller side (invented)
${SIGNAL_MODELS}
${SWITCHED_SUPPLY}
${COLD_SIDE}
C410 vcc gc 10u
${fanSwitch(p.FANON ?? 1)}
${speedCommand(p.DUTY ?? 0.5, 'la5')}
${feedback('vf')}
.end`,
  testPoints: [
    tp('TP1', 'v15'),
    tp('TP2', 'vf'),
    tp('TP3', 'b4'),
    tp('TP4', 'oc'),
    tp('TP5', 'la', 'gc'),
    tp('TP6', 'vcc', 'gc'),
    tp('TP7', 'pc'),
    tp('TP8', 'vsp'),
    tp('TP9', 'la5', 'gc'),
    tp('TP10', 'fa'),
    tp('TP11', 'fo', 'gc'),
    tp('TP12', 'fin', 'gc'),
    tp('CN4-1', 's15'),
  ],
};
