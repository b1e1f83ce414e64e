import type { RideRow } from '../db/tables';
import type { RideSummary } from '../rides/types';

/** A stored session's summary, with the canonical field names of PRODUCT.md. */
export function summaryOf(row: RideRow): RideSummary {
  return {
    startedAt: row.started_at.toISOString(),
    durationS: row.duration_s,
    activeS: row.active_s,
    passiveS: row.passive_s,
    cooldownS: row.cooldown_s,
    distanceM: row.distance_m,
    meanPowerW: row.mean_power_w,
    peakPower5sW: row.peak_power_5s_w,
    workKj: row.work_kj,
    meanCadenceRpm: row.mean_cadence_rpm,
    currentPerWattMaPerW: row.current_per_watt_ma_per_w,
    channels: row.channels,
    pulseWidthUs: row.pulse_width_us,
    frequencyHz: row.frequency_hz,
    enduranceRatioPct: row.endurance_ratio_pct ?? null,
    samples: row.samples,
    warnings: row.warnings,
  };
}

export function sessionListItem(row: RideRow) {
  return {
    id: row.id,
    clientId: row.client_id,
    uploadId: row.upload_id,
    startedAt: row.started_at.toISOString(),
    startedAtSource: row.started_at_source,
    summary: summaryOf(row),
  };
}
