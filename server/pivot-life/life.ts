/**
 * A ride's pivot life (`GET /api/rides/:id/life`): per pivot, each fatigue detail's damage from the running
 * log and its projected limit date, the wear trends, the NDT due dates and the EN 1993-1-8 pin
 * utilisations. The damage per ride cycle comes from the latest analysed inspection that stored fatigue
 * (not amended since), else from the design motion run through the same load cases and fatigue engine.
 * The arithmetic and its assumptions are in features/pivot-life/life-math.ts.
 */
import { and, desc, eq, isNotNull, notExists, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import { z } from 'zod';

import { inspections } from '@/db/server/inspections';
import { fatigueOfLoadCases, governingFatigueCase } from '@/features/fatigue';
import { designToCycleInput, type DesignData } from '@/features/loads/design-schema';
import { analyseLoadCases, designStops } from '@/features/loads/load-cases';
import { pinChecksAtPeak, type LoadCaseKind } from '@/features/loads/engine';
import { accumulateDetail, summariseLog } from '@/features/pivot-life/life-math';
import type { DetailLife, PinUtilisation, PivotLife, RideLife } from '@/features/pivot-life/schema';
import {
  storedFatigueDetailSchema,
  storedLoadCaseSchema,
  storedPinCheckSchema,
} from '@/features/records/analysis-schema';
import type { Db } from '@/server/db';
import { rideNdtDue } from '@/server/pivot-life/ndt';
import { runningLogDays } from '@/server/pivot-life/running-log';
import { rideWearTrends } from '@/server/pivot-life/wear';
import { findDesignVersion } from '@/server/registry/design';
import { mustFindRide } from '@/server/registry/rides';

const amendment = alias(inspections, 'amendment');

/** What the design basis needs of a design version. */
type DesignVersion = { id: string; version: number; data: DesignData };

/** A detail's damage per ride cycle from whichever basis, with what the life needs beside it. */
type BasisDetail = {
  detail: number;
  joint: number;
  name: string;
  categoryMPa: number;
  damagePerRideCycle: number;
  damageLimit: number;
  governingCase: LoadCaseKind | null;
};

type Basis = RideLife['basis'] & { details: BasisDetail[]; design: DesignData | null };

/** A corrected record replaces the one it amends, so only inspections not amended since count. */
const notAmended = (db: Pick<Db, 'select'>) =>
  notExists(db.select({ id: amendment.id }).from(amendment).where(eq(amendment.amendsId, inspections.id)));

/** The latest not-amended inspection whose stored analysis holds `field` as a list, with that list. */
function latestWith(db: Pick<Db, 'select'>, rideId: string, field: 'fatigue' | 'pinChecks') {
  return (
    db
      .select({
        id: inspections.id,
        submittedAt: inspections.submittedAt,
        designVersion: sql<number | null>`json_extract(${inspections.analysis}, '$.designVersion')`,
        durationS: sql<number | null>`json_extract(${inspections.analysis}, '$.durationS')`,
        loadCases: sql<string | null>`json_extract(${inspections.analysis}, '$.loadCases')`,
        list: sql<string>`json_extract(${inspections.analysis}, ${`$.${field}`})`,
      })
      .from(inspections)
      .where(
        and(
          eq(inspections.rideId, rideId),
          isNotNull(inspections.analysedAt),
          sql`json_type(${inspections.analysis}, ${`$.${field}`}) = 'array'`,
          notAmended(db),
        ),
      )
      .orderBy(desc(inspections.submittedAt), desc(inspections.id))
      .limit(1)
      .get() ?? null
  );
}

const storedFatigueList = z.array(storedFatigueDetailSchema);
const storedCases = z.array(storedLoadCaseSchema.pick({ kind: true, durationS: true }));

function parseJson(text: string | null): unknown {
  if (text === null) return null;
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}

/** The fatigue stored with the latest analysis that has it; null when none has (or it cannot be read). */
function inspectionBasis(db: Pick<Db, 'select'>, rideId: string): Basis | null {
  const row = latestWith(db, rideId, 'fatigue');
  if (!row) return null;
  const fatigue = storedFatigueList.safeParse(parseJson(row.list));
  if (!fatigue.success || fatigue.data.length === 0) return null;
  const version = row.designVersion !== null ? findDesignVersion(db, rideId, row.designVersion) : null;
  const data = version?.data ?? null;
  const rideCycleS = data?.fatigue?.rideCycleS ?? null;
  const stops = data?.fatigue?.stopsPerRideCycle ?? 1;
  const cases = storedCases.safeParse(parseJson(row.loadCases));
  const operatingS =
    (cases.success ? cases.data.find((c) => c.kind === 'operating')?.durationS : undefined) ?? row.durationS;
  return {
    source: 'inspection',
    inspectionId: row.id,
    submittedAt: row.submittedAt,
    designVersion: row.designVersion,
    rideCycleS,
    design: data,
    details: fatigue.data.map((d) => ({
      detail: d.detail,
      joint: d.joint,
      name: d.name,
      categoryMPa: d.categoryMPa,
      damagePerRideCycle: d.damagePerRideCycle,
      damageLimit: d.damageLimit,
      // Analyses stored before the cases carried their part of a ride cycle: it follows from the ride cycle
      // time and stops of the design version analysed.
      governingCase: governingFatigueCase({
        cases: d.cases.map((c) => ({
          kind: c.kind,
          perRideCycle:
            c.perRideCycle ??
            (c.kind === 'operating'
              ? rideCycleS !== null && operatingS
                ? (c.damage * rideCycleS) / operatingS
                : c.damage
              : c.kind === 'service_stop'
                ? stops * c.damage
                : 0),
        })),
      }),
    })),
  };
}

/**
 * The design motion's fatigue and pin checks, per design version (the load cases take a while; a version
 * never changes).
 */
type DesignLife = { details: BasisDetail[]; pins: Map<number, PinUtilisation> };
const designLifeCache = new Map<string, DesignLife>();
const DESIGN_CACHE_SIZE = 50;

function designLife(version: DesignVersion): DesignLife {
  const cached = designLifeCache.get(version.id);
  if (cached) return cached;
  const cases = analyseLoadCases(designToCycleInput(version.data), designStops(version.data));
  const details = version.data.fatigue?.details.length
    ? fatigueOfLoadCases(version.data, cases.cases).map((d) => ({
        detail: d.detail,
        joint: d.joint,
        name: d.name,
        categoryMPa: d.categoryMPa,
        damagePerRideCycle: d.damagePerRideCycle,
        damageLimit: d.damageLimit,
        governingCase: governingFatigueCase(d),
      }))
    : [];
  // EN 1993-1-8 at the peak over the design's load cases, as a stored analysis keeps them.
  const pins = new Map<number, PinUtilisation>();
  const checks = pinChecksAtPeak(
    { joints: cases.operating.joints, pins: cases.operating.pins, loadCases: cases.cases },
    version.data.pivots,
  );
  for (const { joint, name: _name, ...pin } of checks) pins.set(joint, pin);
  if (designLifeCache.size >= DESIGN_CACHE_SIZE) designLifeCache.clear();
  const life = { details, pins };
  designLifeCache.set(version.id, life);
  return life;
}

function designBasis(version: DesignVersion | null): Basis {
  const fatigue = version?.data.fatigue;
  if (!version || !fatigue || fatigue.details.length === 0)
    return {
      source: 'none',
      inspectionId: null,
      submittedAt: null,
      designVersion: version?.version ?? null,
      rideCycleS: fatigue?.rideCycleS ?? null,
      design: version?.data ?? null,
      details: [],
    };
  return {
    source: 'design',
    inspectionId: null,
    submittedAt: null,
    designVersion: version.version,
    rideCycleS: fatigue.rideCycleS,
    design: version.data,
    details: designLife(version).details,
  };
}

function latestPinChecks(db: Pick<Db, 'select'>, rideId: string): Map<number, PinUtilisation> {
  const out = new Map<number, PinUtilisation>();
  const row = latestWith(db, rideId, 'pinChecks');
  const parsed = z.array(storedPinCheckSchema).safeParse(parseJson(row?.list ?? null));
  if (parsed.success) for (const { joint, name: _name, ...pin } of parsed.data) out.set(joint, pin);
  return out;
}

export function rideLife(db: Pick<Db, 'select'>, rideId: string, today: string): RideLife {
  mustFindRide(db, rideId);
  const current = findDesignVersion(db, rideId);
  const basis = inspectionBasis(db, rideId) ?? designBasis(current);
  // The log's hours are converted at the ride cycle time the damage per ride cycle was worked out for.
  const rideCycleS = basis.rideCycleS ?? current?.data.fatigue?.rideCycleS ?? null;
  const log = summariseLog(runningLogDays(db, rideId), rideCycleS);
  // Pin checks from the latest analysis that made them, else from the design motion's load cases.
  const analysedPins = latestPinChecks(db, rideId);
  const pins = analysedPins.size || !current ? analysedPins : designLife(current).pins;
  const wear = rideWearTrends(db, rideId, today);
  const ndt = rideNdtDue(db, rideId, today);

  const design = current?.data ?? basis.design;
  const joints = new Set<number>([
    ...(design?.pivots.map((p) => p.joint) ?? []),
    ...basis.details.map((d) => d.joint),
    ...wear.keys(),
    ...ndt.keys(),
  ]);
  const kindOf = (detail: number) => basis.design?.fatigue?.details[detail]?.kind ?? 'other';
  const pivots: PivotLife[] = [...joints]
    .sort((a, b) => a - b)
    .map((joint) => ({
      joint,
      name:
        design?.pivots.find((p) => p.joint === joint)?.name ??
        design?.bodies[joint]?.name ??
        `Pivot ${joint + 1}`,
      details: basis.details
        .filter((d) => d.joint === joint)
        .map((d): DetailLife => ({
          detail: d.detail,
          name: d.name,
          kind: kindOf(d.detail),
          categoryMPa: d.categoryMPa,
          damagePerRideCycle: d.damagePerRideCycle,
          governingCase: d.governingCase,
          cyclesLogged: log.cyclesLogged,
          damageLimit: d.damageLimit,
          ...accumulateDetail(d.damagePerRideCycle, d.damageLimit, log.cyclesLogged, log.cyclesPerDay, today),
        })),
      wear: wear.get(joint) ?? [],
      ndt: ndt.get(joint) ?? [],
      pin: pins.get(joint) ?? null,
    }));

  return {
    rideId,
    asOf: today,
    basis: {
      source: basis.source,
      inspectionId: basis.inspectionId,
      submittedAt: basis.submittedAt,
      designVersion: basis.designVersion,
      rideCycleS,
    },
    log: {
      entries: log.entries,
      firstDay: log.firstDay,
      lastDay: log.lastDay,
      cyclesLogged: log.cyclesLogged,
      cyclesPerDay: log.cyclesPerDay,
    },
    pivots,
  };
}
