// The outdoor fan-drive demo board's circuit, section by section (invented: round textbook values, no real
// product). Written as plain SPICE because the diagnosis tests and the demo jobs are tuned to these exact
// elements; composeBoard assembles it with the same header and element order as the board always had.
export const OUTDOOR_HEADER = `.model DR D(is=1e-9 n=1.8)
.model DS D(is=2.5e-9 n=1.75)
.model DZ D(is=1e-14 n=1 bv=15.7 ibv=5m)
.model DLED D(is=1e-20 n=1.8)
.model QN NPN(is=1e-14 bf=200)
.model QP PNP(is=1e-14 bf=50)
.model QPH NPN(is=1e-14 bf=300)

.subckt REG15 in out com
RB in b 100
DZ1 com b DZ
Q1 in b out QN
ROUT out com 10k
.ends

.subckt OPTO a k c e
VS a ai 0
DL ai k DLED
F1 e qb VS 0.01
Q1 c qb e QPH
RBE qb e 10meg
.ends`;

export const OUTDOOR_BUS = `VBUS bus 0 DC 310
C1 bus 0 220u
R1 bus bl 150k
R2 bl 0 150k
R3 bus bsense 1meg
R4 bsense 0 5.1k
C2 bsense 0 10n
R34 bsense ad2 1k
C19 ad2 0 10n`;

/** Auxiliary supply, the 15 V regulator and the 5 V logic supply. */
export const OUTDOOR_SUPPLIES = `VAUX aux 0 DC 18
D1 aux aux1 DR
C3 aux1 0 470u
C4 aux1 0 100n
R35 aux1 0 22k
XVREG aux1 v15 0 REG15
C5 v15 0 100u
C6 v15 0 100n
R5 v15 led1 6.8k
D2 led1 0 DLED
V5 v5 0 DC 5
C7 v5 0 10u
C20 v5 0 100n`;

/** Fan control supply: opto-driven PNP high-side switch; RLOAD is the motor's control electronics. */
export const OUTDOOR_FAN_SWITCH = `VCMD cmd 0 DC {5*FAN_ON}
R6 cmd la 470
XU1 la 0 oc 0 OPTO
R7 oc b1 2.2k
R8 v15 b1 10k
Q1 vfan b1 v15 QP
C8 vfan 0 10u
C9 vfan 0 100n
C10 vfan 0 10n
D3 0 vfan DS
R9 vfan 0 10k
RLOAD vfan 0 1.5k`;

/** Speed feedback opto; R13 stands for the motor's FG output sinking the LED. */
export const OUTDOOR_FEEDBACK = `R12 vfan fa 2.2k
XU2 fa fgk fbc 0 OPTO
R13 fgk 0 1k
R14 v5 fbc 10k
R15 fbc fbm 1k
C11 fbm 0 1n
R16 fbm 0 100k`;

// R22 sets the full-speed command near 5 V (15 V · 1.98k / (3.9k + 1.98k)), inside the motor's few-volt input range.
export const OUTDOOR_SPEED_COMMAND = `VSPD spd 0 DC {5*SPEED}
R17 spd b2 10k
R18 b2 0 10k
Q2 c2 b2 0 QN
R19 c2 b3 4.7k
R21 v15 b3 10k
Q3 c3 b3 v15 QP
R22 c3 vsp 3.9k
R23 vsp 0 2.2k
C12 vsp 0 1u
C13 vsp 0 100n
R24 vsp 0 20k`;

/** Pull-ups, the thermistor divider and the relay driver. */
export const OUTDOOR_LOGIC = `R25 v5 rst 10k
C14 rst 0 100n
R26 v5 sda 4.7k
R27 v5 scl 4.7k
R28 v5 th1 10k
RTH1 th1 0 10k
C15 th1 0 100n
R29 th1 ad1 1k
C16 ad1 0 10n
VIO5 io5 0 DC 0
R32 io5 b5 4.7k
R33 b5 0 10k
Q4 rl b5 0 QN
RRLY v15 rl 400
D5 rl v15 DS`;
