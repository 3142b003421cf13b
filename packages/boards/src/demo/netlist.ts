// The outdoor fan-drive demo board's DC circuit model, as composed (the diagnosis tests read it from here).
import { OUTDOOR_FAN_BOARD } from './outdoor-fan';

export const OUTDOOR_FAN_NETLIST: string = OUTDOOR_FAN_BOARD.netlist;
