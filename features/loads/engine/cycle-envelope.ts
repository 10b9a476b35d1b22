/** The whole cycle's results against the design envelope: each joint's, pin's and seat's limits. */
import { STANDARD_GRAVITY_MS2 } from '@/features/loads/engine/chain';
import type {
  CycleLimits,
  EnvelopeItem,
  JointHistory,
  PinResult,
  SeatHistory,
} from '@/features/loads/engine/cycle-types';
import {
  type Evaluation,
  type Limit,
  evaluateExtremes,
  evaluateLimit,
} from '@/features/loads/engine/envelope';
import { type PinCheckResult, checkPin } from '@/features/loads/engine/pin-checks';
import { pinStresses, pinWear } from '@/features/loads/engine/pins';
import type { QuantityKind } from '@/lib/units';

export function evaluateEnvelope(
  joints: JointHistory[],
  seats: SeatHistory[],
  limits: CycleLimits | undefined,
  margin: number,
): { envelope: EnvelopeItem[]; pins: PinResult[] } {
  const envelope: EnvelopeItem[] = [];
  const pins: PinResult[] = [];
  const add = (id: string, label: string, quantity: QuantityKind, e: Evaluation) =>
    envelope.push({ id, label, quantity, ...e });
  const upper = (max: number): Limit => ({ kind: 'upper', max });

  (limits?.joints ?? []).forEach((jl, i) => {
    const joint = joints[i];
    if (!jl || !joint) return;
    const key = `joints.${i}`;
    const who = joint.name;
    if (jl.maxRateRadS !== undefined)
      add(
        `${key}.rate`,
        `${who}: peak rate`,
        'rate',
        evaluateLimit(joint.peakRateRadS, upper(jl.maxRateRadS), margin),
      );
    if (jl.maxAmplitudeRad !== undefined && joint.amplitudeRad !== null)
      add(
        `${key}.amplitude`,
        `${who}: swing amplitude`,
        'angle',
        evaluateLimit(joint.amplitudeRad, upper(jl.maxAmplitudeRad), margin),
      );
    if (jl.maxForceN !== undefined)
      add(
        `${key}.force`,
        `${who}: peak pivot force`,
        'force',
        evaluateLimit(joint.peakForce.value, upper(jl.maxForceN), margin),
      );
    if (jl.maxTorqueNm !== undefined)
      add(
        `${key}.torque`,
        `${who}: peak drive torque`,
        'moment',
        evaluateLimit(Math.abs(joint.peakTorque.value), upper(jl.maxTorqueNm), margin),
      );
    const pin = jl.pin;
    if (!pin) return;
    const diameter = pin.measuredDiameterM ?? pin.nominalDiameterM;
    const stresses = pinStresses(joint.peakForce.value, {
      diameterM: diameter,
      shear: pin.shear,
      bearingLengthM: pin.bearingLengthM,
    });
    const wear =
      pin.minimumDiameterM !== undefined && pin.measuredDiameterM !== undefined
        ? pinWear(pin.nominalDiameterM, pin.minimumDiameterM, pin.measuredDiameterM)
        : null;
    const check = pin.en1993 ? checkPin(joint.peakForce.value, diameter, pin.shear, pin.en1993) : null;
    pins.push({ joint: i, stresses, wear, ...(check ? { check } : {}) });
    if (check) envelope.push(...pinCheckItems(key, who, check, margin));
    if (pin.maxShearStressPa !== undefined)
      add(
        `${key}.pin.shear`,
        `${who}: pin shear stress`,
        'stress',
        evaluateLimit(stresses.shearStressPa, upper(pin.maxShearStressPa), margin),
      );
    if (pin.maxBearingPressurePa !== undefined)
      add(
        `${key}.pin.bearing`,
        `${who}: pin bearing pressure`,
        'pressure',
        evaluateLimit(stresses.bearingPressurePa, upper(pin.maxBearingPressurePa), margin),
      );
    if (pin.minimumDiameterM !== undefined && pin.measuredDiameterM !== undefined)
      add(
        `${key}.pin.diameter`,
        `${who}: pin diameter (wear)`,
        'lengthSmall',
        evaluateLimit(
          pin.measuredDiameterM,
          { kind: 'lower', min: pin.minimumDiameterM, nominal: pin.nominalDiameterM },
          margin,
        ),
      );
    if (pin.maxClearanceM !== undefined && pin.measuredClearanceM !== undefined)
      add(
        `${key}.pin.clearance`,
        `${who}: bushing clearance`,
        'lengthSmall',
        evaluateLimit(pin.measuredClearanceM, upper(pin.maxClearanceM), margin),
      );
  });

  const rider = limits?.rider;
  if (rider) {
    seats.forEach((seat, j) => {
      for (const axis of ['gx', 'gz'] as const) {
        const lim = rider[axis];
        if (!lim || (lim.min === undefined && lim.max === undefined)) continue;
        const e = seat.extremes[axis];
        // Seat histories and limits are in g; envelope items are SI like every other quantity.
        const si = (v: number | undefined) => (v === undefined ? undefined : v * STANDARD_GRAVITY_MS2);
        add(
          `seats.${j}.${axis}`,
          `${seat.name}: rider ${axis === 'gx' ? 'Gx' : 'Gz'}`,
          'accel',
          evaluateExtremes(
            e.min * STANDARD_GRAVITY_MS2,
            e.max * STANDARD_GRAVITY_MS2,
            { kind: 'range', min: si(lim.min), max: si(lim.max) },
            margin,
          ),
        );
      }
    });
  }
  return { envelope, pins };
}

/** The standard every pin-check item is labelled with. */
export const PIN_CHECK_STANDARD = 'EN 1993-1-8 Table 3.10';

/**
 * A pin's Table 3.10 checks as envelope items (`joints.<i>.pin.en1993.<check>`): each design effect
 * against its design resistance, so the ratio is the utilisation. The combined check's left side grows
 * as F², so it is held as the design force against the force at which the left side reaches 1: the ratio
 * is then √((M/M_Rd)² + (F_v/F_v,Rd)²), and it passes and fails exactly when the Table's check does.
 */
export function pinCheckItems(key: string, who: string, c: PinCheckResult, margin: number): EnvelopeItem[] {
  const items: EnvelopeItem[] = [];
  const std = PIN_CHECK_STANDARD;
  const item = (id: string, label: string, quantity: QuantityKind, effect: number, resistance: number) =>
    items.push({
      id: `${key}.pin.en1993.${id}`,
      label: `${who}: ${label} (${std})`,
      quantity,
      ...evaluateLimit(effect, { kind: 'upper', max: resistance }, margin),
    });
  const plate = (p: 'inner' | 'outer') => (p === 'inner' ? 'inner plate' : 'outer plate');
  const planes = c.shear === 'double' ? 'per plane' : 'one plane';
  item('shear', `pin shear ${planes}, γM2`, 'force', c.shearCheck.effect, c.shearCheck.resistance);
  item(
    'bearing',
    `pin bearing, ${plate(c.bearingCheck.plate)}, γM0`,
    'force',
    c.bearingCheck.effect,
    c.bearingCheck.resistance,
  );
  item('bending', 'pin bending, γM0', 'moment', c.bendingCheck.effect, c.bendingCheck.resistance);
  item(
    'combined',
    'pin shear + bending interaction, as load',
    'force',
    c.designForceN,
    c.combinedResistanceN,
  );
  if (c.bearingServiceCheck)
    item(
      'bearing_ser',
      `pin bearing (serviceability), ${plate(c.bearingServiceCheck.plate)}, γM6,ser`,
      'force',
      c.bearingServiceCheck.effect,
      c.bearingServiceCheck.resistance,
    );
  if (c.bendingServiceCheck)
    item(
      'bending_ser',
      'pin bending (serviceability), γM6,ser',
      'moment',
      c.bendingServiceCheck.effect,
      c.bendingServiceCheck.resistance,
    );
  return items;
}
