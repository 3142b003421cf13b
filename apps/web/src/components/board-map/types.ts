import type { MarkerState } from '@/lib/map-geometry';

export interface MapPoint {
  id: string;
  label: string;
  x: number;
  y: number;
  net: string;
  state: MarkerState;
}
export interface MapPart {
  id: string;
  x: number;
  y: number;
  width: number;
  height: number;
}
export interface MapConnector {
  id: string;
  x: number;
  y: number;
  pins: { label: string; x: number; y: number; net: string }[];
}
