// What reading a ride file hands to ingest: the summary, the metadata and the
// series already encoded for storage, or the refusal with the device serial
// (an import profile attached to that serial may be what reads the file). A
// plain value, so it can come back from a parse process.
import { deviceSerialOf, parseRide } from './parse';
import { encodeSeries } from './series-codec';
import type { ParseOptions, RideMetadata, RideRefusal, RideSummary } from './types';

export type RideReading =
  | { ok: true; summary: RideSummary; metadata: RideMetadata; series: Uint8Array }
  | { ok: false; error: RideRefusal['error']; deviceSerial: string | null };

export function readRideFile(bytes: Uint8Array, options: ParseOptions): RideReading {
  const parsed = parseRide(bytes, options);
  if (!parsed.ok) return { ok: false, error: parsed.error, deviceSerial: deviceSerialOf(bytes) };
  return { ok: true, summary: parsed.summary, metadata: parsed.metadata, series: encodeSeries(parsed.series) };
}
