import type { BoardModel } from '@splitscope/contract';
import { INDOOR_FAN_BOARD } from './indoor-fan';
import { OUTDOOR_FAN_BOARD } from './outdoor-fan';

export { OUTDOOR_FAN_BOARD, OUTDOOR_FAN_SPEC } from './outdoor-fan';
export { INDOOR_FAN_BOARD, INDOOR_FAN_SPEC } from './indoor-fan';
export const DEMO_BOARDS: BoardModel[] = [OUTDOOR_FAN_BOARD, INDOOR_FAN_BOARD];
