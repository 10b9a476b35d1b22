/**
 * From an inspection's readings to the load check: measured speed, period and amplitude replace the
 * design motion of their joint; measured pin diameter and clearance are checked against the pivot's
 * wear limits. A joint the design marks as a free swing runs the free swing from its measured amplitude;
 * every analysis includes the stops the design data defines. Pure TypeScript: the phone's instant preview
 * and the server's authoritative analysis run exactly this.
 */
import {
  type CycleInput,
  type CycleResult,
  ENGINE_VERSION,
  type MotionProfile,
} from '@/features/loads/engine';
import { withChecklistLimits } from '@/features/records/checklist-limits';
import { type InspectionResult, runLoadCheck } from '@/features/records/load-check';
import type { ChecklistAnswer, DevicePreview, Reading } from '@/features/records/schema';
import { motionProfileOf, motionRecordWarnings } from '@/features/records/motion-record';
import type { MotionRecord } from '@/features/records/motion-record-schema';
import { type DesignData, type MeasuredInputs, designToCycleInput } from '@/features/loads/design-schema';
import type { ChecklistContent } from '@/features/registry/schema';

/** The latest reading of a kind for a joint (readings are kept in the order they were taken). */
function latest(readings: readonly Reading[], kind: Reading['kind'], joint: number): Reading | undefined {
  let found: Reading | undefined;
  for (const r of readings) if (r.kind === kind && r.joint === joint) found = r;
  return found;
}

/** Which joints have measured motion, and the profile each then runs. */
function measuredInputs(
  design: DesignData,
  readings: readonly Reading[],
  records: readonly MotionRecord[] = [],
): MeasuredInputs {
  const n = design.bodies.length;
  const profiles: (MotionProfile | null)[] = [];
  const wear: ({ diameterM?: number; clearanceM?: number } | null)[] = [];
  for (let i = 0; i < n; i++) {
    const m = design.motion.find((x) => x.joint === i);
    const speed = latest(readings, 'speed', i);
    const period = latest(readings, 'period', i);
    const amplitude = latest(readings, 'amplitude', i);
    let profile: MotionProfile | null = null;
    if (m?.kind === 'constant' && (speed || period)) {
      // Speed readings are stored in rad/s; a timed period means one revolution per period.
      const rpm = speed ? (speed.valueSI * 60) / (2 * Math.PI) : 60 / (period as Reading).valueSI;
      profile = { kind: 'constant', rpm: Math.sign(m.rpm ?? 1) * Math.abs(rpm) };
    } else if (m?.kind === 'swing' && m.freeSwing && amplitude) {
      // A free pin swings as the chain's equations say: released from rest at the measured amplitude
      // (design swings are centred on 0). Its period is computed and compared with a measured one.
      profile = { kind: 'free', angleRad: amplitude.valueSI };
    } else if (m?.kind === 'swing' && !m.freeSwing && (amplitude || period)) {
      profile = {
        kind: 'swing',
        amplitudeRad: amplitude?.valueSI ?? m.amplitudeRad ?? 0,
        periodS: period?.valueSI ?? m.periodS ?? 1,
      };
    }
    // A ride cycle recorded with the phone outranks readings of the same joint (features/records/motion-record).
    profiles.push(motionProfileOf(records, i) ?? profile);
    const d = latest(readings, 'pin_diameter', i);
    const c = latest(readings, 'clearance', i);
    wear.push(d || c ? { diameterM: d?.valueSI, clearanceM: c?.valueSI } : null);
  }
  return { profiles, wear };
}

export function inspectionCycleInput(
  design: DesignData,
  readings: readonly Reading[],
  samples = 360,
  records: readonly MotionRecord[] = [],
): CycleInput {
  return designToCycleInput(design, measuredInputs(design, readings, records), samples);
}

export function analyseInspection(
  design: DesignData,
  readings: readonly Reading[],
  samples = 360,
  records: readonly MotionRecord[] = [],
): InspectionResult {
  const measured = measuredInputs(design, readings, records);
  // The operating cycle plus the design's stops, with the model of each joint (features/records/load-check).
  const result = runLoadCheck(design, designToCycleInput(design, measured, samples), measured, readings);
  if (records.length) result.warnings = [...result.warnings, ...motionRecordWarnings(design, records)];
  return result;
}

/**
 * The whole record's check: the load check of its readings plus its checklist values against their
 * limits (features/inspections/checklist-limits), so a value entered only in the checklist still counts.
 */
export function analyseRecord(
  design: DesignData,
  record: {
    readings: readonly Reading[];
    checklist: readonly ChecklistAnswer[];
    motionRecords?: readonly MotionRecord[];
  },
  template: ChecklistContent | null,
  samples = 360,
): InspectionResult {
  const result = analyseInspection(design, record.readings, samples, record.motionRecords);
  return { ...result, ...withChecklistLimits(result, design, template, record.checklist, record.readings) };
}

/** The summary the phone sends with a submission, and the server compares with its own. */
export function previewOf(result: CycleResult): DevicePreview {
  return {
    engineVersion: ENGINE_VERSION,
    status: result.envelope.length ? result.status : null,
    peakForceN: result.joints.map((j) => j.peakForce.value),
  };
}

/** Where the server's analysis and the phone's preview disagree (relative tolerance on peaks). */
export function previewDifferences(
  device: DevicePreview | null,
  server: DevicePreview,
  tolerance = 1e-6,
): string[] {
  if (!device) return ['The phone sent no preview.'];
  const out: string[] = [];
  if (device.engineVersion !== server.engineVersion)
    out.push(`Engine version: phone ${device.engineVersion}, server ${server.engineVersion}.`);
  if (device.status !== server.status)
    out.push(`Status: phone ${device.status ?? 'none'}, server ${server.status ?? 'none'}.`);
  if (device.peakForceN.length !== server.peakForceN.length)
    out.push('The phone analysed a different number of pivots.');
  else
    server.peakForceN.forEach((s, i) => {
      const d = device.peakForceN[i];
      if (Math.abs(s - d) > tolerance * Math.max(1, Math.abs(s)))
        out.push(`Pivot ${i + 1} peak force: phone ${d.toFixed(0)} N, server ${s.toFixed(0)} N.`);
    });
  return out;
}
