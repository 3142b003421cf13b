// Invented power-side board sections of mini-split control boards (values round and made up, designators of
// this bench only). Each netlist is the DC model a shop would write; B01's mains input is a DC source at the
// mains peak for the engine, and a 50 Hz sine for the bench's ground truth of powered DC V readings.
import { tp, type BenchBoard } from './board';

export const B01_BUS: BenchBoard = {
  id: 'B01',
  title: 'mains bridge, bulk capacitor, bleeder, bus sense',
  defaults: {},
  mains: { source: 'VAC', sin: 'DC 0 SIN(0 325 50)' },
  acMains: ['l', 'n'],
  netlist: () => `* B01 mains input, bridge rectifier, bulk capacitor, bleeder and bus sense (invented)
.model DBR D(is=5e-10 n=1.9 rs=0.03 cjo=40p)
VAC l n DC 325
CX101 l n 470n
RX101 l n 1meg
RNTC101 l l1 4.7
D101 l1 bus DBR
D102 n bus DBR
D103 0 l1 DBR
D104 0 n DBR
C101 bus 0 470u
C102 bus 0 100n
R101 bus bl 220k
R102 bl 0 220k
R103 bus bs 1.5meg
R104 bs 0 10k
C103 bs 0 100n
R105 bs adc 1k
C104 adc 0 10n
RLD101 bus 0 33k
.end`,
  testPoints: [tp('TP1', 'bus'), tp('TP2', 'bs'), tp('TP3', 'adc'), tp('TP4', 'bl'), tp('TP5', 'l1'), tp('CN1-1', 'l'), tp('CN1-2', 'n')],
};

export const B02_REG15: BenchBoard = {
  id: 'B02',
  title: 'auxiliary rectifier and discrete 15 V series-pass regulator',
  defaults: {},
  kindOverrides: { D202: 'led' },
  netlist: () => `* B02 auxiliary supply and a discrete 15 V series-pass regulator (invented)
.model DRA D(is=2e-9 n=1.8 rs=0.1)
.model DZ16 D(is=1e-14 n=1 bv=15.6 ibv=5m)
.model QNP NPN(is=2e-14 bf=120)
.model DPL D(is=1e-20 n=1.9)
VAUX aux 0 DC 24
RF201 aux a0 2.2
D201 a0 a1 DRA
C201 a1 0 330u
R201 a1 zb 1.5k
DZ201 0 zb DZ16
C202 zb 0 10u
Q201 a1 zb v15 QNP
C203 v15 0 100u
C204 v15 0 100n
R202 v15 0 3.3k
R203 v15 pl 4.7k
D202 pl 0 DPL
RLD201 v15 0 150
.end`,
  testPoints: [tp('TP1', 'a1'), tp('TP2', 'zb'), tp('TP3', 'v15'), tp('TP4', 'a0'), tp('TP5', 'pl')],
};

export const B03_REG5: BenchBoard = {
  id: 'B03',
  title: '5 V regulator block built from discrete parts',
  defaults: {},
  kindOverrides: { XU301: 'regulator', D302: 'led' },
  netlist: () => `* B03 5 V logic regulator, a 78xx-style block from discrete parts (invented)
.model DZ56R D(is=1e-14 n=1 bv=5.6 ibv=2m)
.model QNR NPN(is=1e-14 bf=150)
.model DPL D(is=1e-20 n=1.9)
.subckt REG5 in out com
RBIAS in zr 1k
DZREF com zr DZ56R
QPASS in zr out QNR
RMIN out com 4.7k
.ends
V15 v15 0 DC 15
R301 v15 vin 22
C301 vin 0 47u
XU301 vin v5 0 REG5
C302 v5 0 10u
C303 v5 0 100n
R302 v5 pl 1k
D302 pl 0 DPL
RLD301 v5 0 100
.end`,
  testPoints: [tp('TP1', 'v15'), tp('TP2', 'vin'), tp('TP3', 'v5'), tp('TP4', 'pl')],
};

export const B09_ZENER: BenchBoard = {
  id: 'B09',
  title: 'zener-clamped 5.6 V reference with indicator LED',
  defaults: {},
  kindOverrides: { D903: 'led' },
  netlist: () => `* B09 zener-clamped 5.6 V reference with an indicator LED (invented)
.model DZ56 D(is=1e-14 n=1 bv=5.6 ibv=5m)
.model DIND D(is=1e-20 n=1.9)
V12 v12 0 DC 12
R901 v12 vz 330
DZ901 0 vz DZ56
C901 vz 0 47u
R902 vz 0 1.5k
R903 vz led 680
D903 led 0 DIND
R904 vz ref 10k
R905 ref 0 10k
.end`,
  testPoints: [tp('TP1', 'v12'), tp('TP2', 'vz'), tp('TP3', 'led'), tp('TP4', 'ref')],
};

export const B10_SHUNT: BenchBoard = {
  id: 'B10',
  title: 'motor current-sense shunt, RC filter and trip input',
  defaults: {},
  netlist: () => `* B10 motor current-sense shunt with an RC filter and a trip input (invented)
.model DCL D(is=2e-9 n=1.9)
VBUS bus 0 DC 310
RMOT bus mn 155
RSH1 mn 0 0.05
R1001 mn cs 1k
C1001 cs 0 1n
R1002 cs 0 10k
VCC vcc 0 DC 5
R1003 vcc cs 100k
D1001 cs vcc DCL
D1002 0 cs DCL
R1004 vcc ref 47k
R1005 ref 0 4.7k
.end`,
  testPoints: [tp('TP1', 'bus'), tp('TP2', 'mn'), tp('TP3', 'cs'), tp('TP4', 'vcc'), tp('TP5', 'ref')],
};

export const B11_BOOTSTRAP: BenchBoard = {
  id: 'B11',
  title: 'gate-driver supply: choke, bootstrap diodes and capacitors',
  defaults: {},
  netlist: () => `* B11 gate-driver supply: 15 V through a choke, bootstrap diodes and capacitors (invented)
.model DFR D(is=1e-10 n=1.7 rs=0.5)
V15 s15 0 DC 15
L1101 s15 vdd 10u
C1101 vdd 0 10u
R1101 vdd 0 2.2k
RBS1 vdd bs 10
DBS1 bs vbu DFR
C1102 vbu vsu 10u
R1102 vbu vsu 33k
RLU vsu 0 0.5
DBS2 bs vbv DFR
C1103 vbv vsv 10u
R1103 vbv vsv 33k
RLV vsv 0 0.5
.end`,
  testPoints: [tp('TP1', 's15'), tp('TP2', 'vdd'), tp('TP3', 'bs'), tp('TP4', 'vbu'), tp('TP5', 'vbv'), tp('TP6', 'vsu'), tp('TP7', 'vsv')],
};
