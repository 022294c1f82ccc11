/** The wire-and-fuse sizer's two requests (pure): the wire for the run, then the fuse for that wire. */
import type { z } from 'zod';
import type { FuseSizeInputSchema } from '#shared/schemas/fuse-size.ts';
import type { WireSizeData, WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import type { Units } from '../internal/format.ts';

export type WireRequest = z.input<typeof WireSizeInputSchema>;
export type FuseRequest = z.input<typeof FuseSizeInputSchema>;

export interface WireFuseValues {
  currentA: number;
  systemVoltageV: number;
  /** In the widget's units: metres (metric) or feet (imperial). */
  oneWayLength: number;
  maxVoltageDropPct?: number;
  /** Already in °C. */
  ambientTempC?: number;
  temperatureRatingC: 60 | 75 | 90;
  continuous: boolean;
}

/** Metric: lengths in m and metric conductor sizes (mm²); imperial: feet and AWG. */
export function wireRequest(v: WireFuseValues, units: Units): WireRequest {
  return {
    currentA: v.currentA,
    systemVoltageV: v.systemVoltageV,
    ...(units === 'imperial' ? { oneWayLengthFt: v.oneWayLength } : { oneWayLengthM: v.oneWayLength }),
    ...(v.maxVoltageDropPct !== undefined ? { maxVoltageDropPct: v.maxVoltageDropPct } : {}),
    ...(v.ambientTempC !== undefined ? { ambientTempC: v.ambientTempC } : {}),
    temperatureRatingC: v.temperatureRatingC,
    continuous: v.continuous,
    sizeSystem: units === 'imperial' ? 'awg' : 'metric',
  };
}

/** The fuse for the recommended wire, or null when no wire in the table passes. */
export function fuseRequest(v: WireFuseValues, wire: WireSizeData): FuseRequest | null {
  if (!wire.recommended) return null;
  return { continuousCurrentA: v.currentA, conductor: { size: wire.recommended.size, temperatureRatingC: v.temperatureRatingC } };
}

export const limitedByText = { ampacity: 'how much current it may carry', voltage_drop: 'voltage drop over the run', protection: 'the fuse it needs' } as const;
