import { count, eq, inArray } from 'drizzle-orm';

import {
  checklistTemplates,
  companies,
  designVersions,
  inspectionSchedules,
  rides,
  sites,
  users,
  type RideClass,
  type RideStatus,
  type SiteKind,
} from '@/db/server/schema';
import type { Role } from '@/features/session/schema';
import { checklistContentSchema } from '@/features/registry/schema';
import { hashPassword } from '@/server/auth/password';
import { assertUserCompany } from '@/server/auth/service';
import type { Config } from '@/server/config';
import type { Db } from '@/server/db';
import { createChecklistTemplate } from '@/server/registry/checklists';
import { addDays, dayInZone, isoDay } from '@/lib/dates';
import { addDemoActivity } from '@/server/seed/demo-activity';
import { topUpDemoBulletins } from '@/server/seed/demo-bulletins';
import { addDemoDailyChecks } from '@/server/seed/demo-daily-checks';
import { topUpDemoInstruments } from '@/server/seed/demo-instruments';
import { demoChecklists, demoDailyChecklists } from '@/server/seed/demo-checklists';
import { demoDesigns } from '@/server/seed/demo-design';
import { storeDemoParts } from '@/server/seed/demo-parts';
import { storeDemoPhotos } from '@/server/seed/demo-photos';
import { diskStorage, storageOf } from '@/server/storage';
import { topUpDemoNdt } from '@/server/seed/demo-ndt';
import { topUpDemoRunningLog } from '@/server/seed/demo-running-log';
import { demoSchedules } from '@/server/seed/demo-schedules';
import { topUpDemoSetups } from '@/server/seed/demo-setups';

/*
 * An invented scenario for trying Pivotwatch out: one inspection body, three ride owners and their rides.
 * Every name, address, phone number and e-mail here is made up (.test domains, drama-range numbers).
 */

export const demoPassword = 'pivotwatch-demo';

const demoInspectionBody = {
  name: 'Halvard Ride Inspection Services',
  phone: '+44 20 7946 0100',
  noticeEmails: [] as string[],
};

export const demoOperators = [
  {
    name: 'Tamsworth Pier Leisure',
    noticeEmails: ['notices@tamsworth-pier.test'],
    phone: '+44 20 7946 0211',
    address: 'Pier Offices, Pier Approach\nTamsworth',
    contacts: [
      {
        name: 'Priya Castellan',
        role: 'Rides manager',
        email: 'operator@pivotwatch.test',
        phone: '+44 20 7946 0212',
      },
      {
        name: 'Dale Merriweather',
        role: 'Chief engineer',
        email: 'engineering@tamsworth-pier.test',
        phone: null,
      },
    ],
  },
  {
    name: 'Corvane Travelling Shows',
    noticeEmails: ['ops@corvane-shows.test'],
    phone: '+44 20 7946 0322',
    address: 'Winter quarters, Yard 4, Brackley Lane\nLowfield',
    contacts: [
      {
        name: 'Owen Falgrave',
        role: 'Show manager',
        email: 'operator2@pivotwatch.test',
        phone: '+44 20 7946 0323',
      },
    ],
  },
  {
    name: 'Elmsridge Family Parks',
    noticeEmails: ['safety@elmsridge-parks.test'],
    phone: '+44 20 7946 0433',
    address: null,
    contacts: [],
  },
] as const;

type OperatorName = (typeof demoOperators)[number]['name'];

export const demoSites: {
  name: string;
  kind: SiteKind;
  address: string;
  locality: string;
  /** A real IANA zone for an invented place: the demo's sites are spread far from UTC on purpose. */
  timeZone: string;
  operator: OperatorName;
}[] = [
  {
    name: 'Tamsworth Pier',
    kind: 'park',
    address: 'Pier Approach',
    locality: 'Tamsworth',
    timeZone: 'Europe/London',
    operator: 'Tamsworth Pier Leisure',
  },
  {
    name: 'Lowfield Common fairground',
    kind: 'travelling_setup',
    address: 'Lowfield Common, north field',
    locality: 'Lowfield',
    timeZone: 'America/Los_Angeles',
    operator: 'Corvane Travelling Shows',
  },
  {
    name: 'Marrowby Wharf winter fair',
    kind: 'travelling_setup',
    address: 'Marrowby Wharf, east apron',
    locality: 'Marrowby',
    timeZone: 'Pacific/Auckland',
    operator: 'Corvane Travelling Shows',
  },
  {
    // A shared ground: its spring fair hosts rides of both demo operators (server/seed/demo-setups.ts).
    name: 'Brackley Meadow showground',
    kind: 'fairground',
    address: 'Brackley Meadow, Mill Lane',
    locality: 'Brackley',
    timeZone: 'Europe/London',
    operator: 'Corvane Travelling Shows',
  },
];

/** The day at a demo site's clock: the seed's relative dates count from it, as the app will. */
export function demoSiteDay(siteName: string | undefined, now: Date): string {
  const zone = demoSites.find((s) => s.name === siteName)?.timeZone;
  return zone ? dayInZone(now, zone) : isoDay(now);
}

type DemoRide = {
  name: string;
  rideClass: RideClass;
  description: string;
  maker: string;
  model: string;
  serial: string;
  year: number;
  site: string;
  operator: OperatorName;
  status: RideStatus;
  statusReason?: string;
};

export const demoRides: DemoRide[] = [
  {
    name: 'Skylark',
    rideClass: 'pendulum_swing',
    description: 'Pendulum arm with a 24-seat ring gondola that also turns on its own axis',
    maker: 'Orrin Ride Works',
    model: 'PX-15',
    serial: 'ORW-PX15-0412',
    year: 2014,
    site: 'Tamsworth Pier',
    operator: 'Tamsworth Pier Leisure',
    status: 'in_service',
  },
  {
    name: 'Twin Comet',
    rideClass: 'rotating_arm',
    description: 'Single rotating arm with a four-seat gondola at each tip',
    maker: 'Brede Motion Engineering',
    model: 'TA-2',
    serial: 'BME-TA2-0097',
    year: 2011,
    site: 'Tamsworth Pier',
    operator: 'Tamsworth Pier Leisure',
    status: 'in_service',
  },
  {
    name: 'Lantern Wheel',
    rideClass: 'wheel',
    description: 'Observation wheel with 18 enclosed gondolas',
    maker: 'Marrow & Finch Wheelwrights',
    model: 'LW-18',
    serial: 'MFW-LW18-0031',
    year: 2008,
    site: 'Tamsworth Pier',
    operator: 'Tamsworth Pier Leisure',
    status: 'in_service',
  },
  {
    name: 'Tidebreaker',
    rideClass: 'rotating_arm',
    description: 'Main arm carrying a gondola on a powered sub-arm',
    maker: 'Orrin Ride Works',
    model: 'RX-30',
    serial: 'ORW-RX30-0158',
    year: 2017,
    site: 'Lowfield Common fairground',
    operator: 'Corvane Travelling Shows',
    status: 'restricted',
    statusReason:
      'Sub-arm pivot clearance near its wear limit at the last inspection: run at the reduced programme only until the bushing is replaced.',
  },
  {
    name: 'Whirligig Chairs',
    rideClass: 'swing_carousel',
    description: 'Chain-swing carousel, 32 single seats on a tilting crown',
    maker: 'Quillon Carousel Works',
    model: 'SC-32',
    serial: 'QCW-SC32-0264',
    year: 2005,
    site: 'Lowfield Common fairground',
    operator: 'Corvane Travelling Shows',
    status: 'in_service',
  },
  {
    name: 'Little Kite',
    rideClass: 'pendulum_swing',
    description: 'Small pendulum swing for younger riders, 12 seats',
    maker: 'Orrin Ride Works',
    model: 'PX-6',
    serial: 'ORW-PX6-0733',
    year: 2019,
    site: 'Lowfield Common fairground',
    operator: 'Corvane Travelling Shows',
    status: 'in_service',
  },
];

/** The demo accounts, all with `demoPassword`. The README and the browser tests list these. */
export const demoUsers: { email: string; name: string; role: Role; company: OperatorName | null }[] = [
  { email: 'admin@pivotwatch.test', name: 'Rowan Ashby', role: 'admin', company: null },
  { email: 'supervisor@pivotwatch.test', name: 'Mira Delacourt', role: 'supervisor', company: null },
  { email: 'inspector@pivotwatch.test', name: 'Tomas Reyne', role: 'inspector', company: null },
  // A second inspector, so two people can share one phone in the demo (and in the shared-phone test).
  { email: 'inspector2@pivotwatch.test', name: 'Lena Marwick', role: 'inspector', company: null },
  {
    email: 'operator@pivotwatch.test',
    name: 'Priya Castellan',
    role: 'operator',
    company: 'Tamsworth Pier Leisure',
  },
  {
    email: 'operator2@pivotwatch.test',
    name: 'Owen Falgrave',
    role: 'operator',
    company: 'Corvane Travelling Shows',
  },
];

type SeedResult = 'seeded' | 'skipped_existing_users' | 'skipped_production';

/** The demo account the seeded records name as their author. */
const demoAuthorEmail = 'admin@pivotwatch.test';
/** The demo inspector, who gets some of the demo's inspections assigned. */
export const demoInspectorEmail = 'inspector@pivotwatch.test';

type SeedOptions = {
  /** The seed day; demo dates are relative to it. */
  now?: Date;
  /**
   * Add the demo's inspection history (inspections, analyses, decisions, findings, photos) too. Defaults
   * to on when seeding a development server's data directory (`config.dataDir`, where the history's photos
   * are stored), so `npm start` opens on a working review desk; off under test, where every test starts
   * from the register alone and makes the inspections it needs.
   */
  activity?: boolean;
};

/**
 * Seeds the demo scenario into a database that has no users yet, in one transaction. Does nothing (and says
 * why) when users exist or when running in production, where demo accounts with a published password
 * would be an open door. A demo database seeded by an earlier release gets the parts added since (design
 * data, inspection history…) through `topUpDemoData`, which only fills what is missing. Photo bytes of the
 * history are stored in the configured storage (under `config.dataDir` on the disk) when it is given.
 */
export async function seedDemoData(
  db: Db,
  config: Pick<Config, 'nodeEnv'> & Partial<Pick<Config, 'dataDir' | 'storage'>>,
  opts: SeedOptions = {},
): Promise<SeedResult> {
  if (config.nodeEnv === 'production') return 'skipped_production';
  const now = opts.now ?? new Date();
  const activity = opts.activity ?? (config.nodeEnv === 'development' && config.dataDir !== undefined);
  if (countUsers(db) > 0) {
    topUpDemoData(db, now, { activity });
    if (activity) await storeActivityPhotos(db, config, now);
    return 'skipped_existing_users';
  }

  // bcrypt is async and slow; hash before the (synchronous) transaction so it holds the lock briefly.
  const hashes = await Promise.all(demoUsers.map(() => hashPassword(demoPassword)));

  const result = db.transaction((tx) => {
    // Checked again inside the transaction: another process may have seeded while we were hashing.
    if (countUsers(tx) > 0) return 'skipped_existing_users';

    tx.insert(companies)
      .values({ kind: 'inspection_body', ...demoInspectionBody })
      .run();
    const companyIds = new Map<string, string>();
    for (const operator of demoOperators) {
      const { id } = tx
        .insert(companies)
        .values({
          kind: 'operator',
          name: operator.name,
          noticeEmails: [...operator.noticeEmails],
          phone: operator.phone,
          address: operator.address,
          contacts: operator.contacts.map((c) => ({ ...c })),
        })
        .returning({ id: companies.id })
        .get();
      companyIds.set(operator.name, id);
    }
    const companyId = (name: string) => {
      const id = companyIds.get(name);
      if (!id) throw new Error(`demo data names an unknown company: ${name}`);
      return id;
    };

    const siteIds = new Map<string, string>();
    for (const { operator, ...site } of demoSites) {
      const { id } = tx
        .insert(sites)
        .values({ ...site, operatorCompanyId: companyId(operator) })
        .returning({ id: sites.id })
        .get();
      siteIds.set(site.name, id);
    }

    for (const { site, operator, statusReason, ...ride } of demoRides) {
      tx.insert(rides)
        .values({
          ...ride,
          siteId: siteIds.get(site) ?? null,
          operatorCompanyId: companyId(operator),
          statusReason: statusReason ?? null,
          statusSince: now.toISOString(),
        })
        .run();
    }

    demoUsers.forEach((user, i) => {
      const userCompanyId = user.company === null ? null : companyId(user.company);
      assertUserCompany(tx, user.role, userCompanyId);
      tx.insert(users)
        .values({
          email: user.email,
          name: user.name,
          role: user.role,
          passwordHash: hashes[i],
          companyId: userCompanyId,
        })
        .run();
    });
    topUpRegister(tx, now);
    return 'seeded' as const;
  });
  if (result === 'seeded' && activity) {
    addDemoActivity(db, now);
    addDemoDailyChecks(db, now);
    await storeActivityPhotos(db, config, now);
  }
  return result;
}

/** The history's photo bytes, as the demo inspector's phone would have uploaded them, and Skylark's demo documents and parts. */
async function storeActivityPhotos(db: Db, config: Partial<Pick<Config, 'dataDir' | 'storage'>>, now: Date) {
  const { dataDir, storage } = config;
  if (!dataDir) return;
  const inspector = db.select({ id: users.id }).from(users).where(eq(users.email, demoInspectorEmail)).get();
  // Into the configured storage (STORAGE_URL), or the disk under DATA_DIR when only that is given.
  const into = storage ? storageOf({ dataDir, storage }) : diskStorage(dataDir);
  if (inspector) await storeDemoPhotos(db, into, inspector.id, now);
  await storeDemoParts(db, into, now);
}

/**
 * Adds the demo records that are missing: version 1 of the design data of each demo ride (found by
 * serial) that has no design data at all, the demo checklist templates when there are no templates, the
 * demo schedule when there are no schedules, and (with `activity`) the demo's inspection history, whose
 * fixed ids and batch ids let it be added exactly once. Design versions and templates are never deleted
 * (templates are archived), so filling an empty place changes nothing anyone entered. Safe to run again.
 */
function topUpDemoData(db: Db, now: Date = new Date(), opts: { activity?: boolean } = {}): void {
  db.transaction((tx) => topUpRegister(tx, now));
  if (opts.activity) {
    addDemoActivity(db, now);
    addDemoDailyChecks(db, now);
  }
}

function topUpRegister(db: Pick<Db, 'select' | 'insert' | 'transaction'>, now: Date): void {
  db.transaction((tx) => {
    const author = tx.select({ id: users.id }).from(users).where(eq(users.email, demoAuthorEmail)).get();
    if (!author) return;
    const demoRideRows = tx
      .select({ id: rides.id, serial: rides.serial })
      .from(rides)
      .where(inArray(rides.serial, Object.keys(demoDesigns)))
      .all();
    for (const ride of demoRideRows) {
      const data = ride.serial === null ? undefined : demoDesigns[ride.serial];
      const has = tx
        .select({ n: count() })
        .from(designVersions)
        .where(eq(designVersions.rideId, ride.id))
        .get();
      if (!data || (has?.n ?? 0) > 0) continue;
      tx.insert(designVersions)
        .values({
          rideId: ride.id,
          version: 1,
          data,
          reason: `Design data entered from ${data.source.document}, revision ${data.source.revision}.`,
          origin: 'seed',
          createdBy: author.id,
        })
        .run();
    }
    topUpDemoNdt(
      tx,
      demoRideRows.map((r) => r.id),
      author.id,
      now,
    );
    topUpDemoRunningLog(
      tx,
      demoRideRows.map((r) => r.id),
      author.id,
      now,
    );

    topUpDemoInstruments(tx, now);
    topUpDemoBulletins(tx, author.id, now);

    const anyTemplate = tx.select({ id: checklistTemplates.id }).from(checklistTemplates).limit(1).get();
    if (!anyTemplate)
      for (const template of demoChecklists)
        createChecklistTemplate(
          tx,
          author.id,
          {
            name: template.name,
            rideClass: template.rideClass,
            content: checklistContentSchema.parse({ areas: template.areas }),
            reason: 'Demo template',
          },
          false,
        );
    // The daily pre-opening checklists came later than the others: added wherever none is set yet.
    const anyDaily = tx
      .select({ id: checklistTemplates.id })
      .from(checklistTemplates)
      .where(eq(checklistTemplates.inspectionType, 'daily_pre_opening'))
      .limit(1)
      .get();
    if (!anyDaily)
      for (const template of demoDailyChecklists)
        createChecklistTemplate(
          tx,
          author.id,
          {
            name: template.name,
            rideClass: template.rideClass,
            inspectionType: 'daily_pre_opening',
            content: checklistContentSchema.parse({ areas: template.areas }),
            reason: 'Demo template',
          },
          false,
        );

    const anySchedule = tx.select({ id: inspectionSchedules.id }).from(inspectionSchedules).limit(1).get();
    const inspector = tx
      .select({ id: users.id })
      .from(users)
      .where(eq(users.email, demoInspectorEmail))
      .get();
    if (!anySchedule) {
      const rideIdOf = new Map(demoRideRows.map((r) => [r.serial, r.id]));
      for (const s of demoSchedules) {
        const rideId = rideIdOf.get(s.serial);
        if (!rideId) continue;
        const today = demoSiteDay(demoRides.find((r) => r.serial === s.serial)?.site, now);
        const assigned = s.assignToDemoInspector && inspector ? inspector.id : null;
        tx.insert(inspectionSchedules)
          .values({
            rideId,
            inspectionType: s.inspectionType,
            intervalDays: s.intervalDays,
            lastDoneOn: s.lastDoneDaysAgo === null ? null : addDays(today, -s.lastDoneDaysAgo),
            dueOn: s.dueInDays === undefined ? null : addDays(today, s.dueInDays),
            assignedTo: assigned,
            assignedAt: assigned ? now.toISOString() : null,
            notes: s.notes ?? null,
          })
          .run();
      }
    }
    topUpDemoSetups(tx, author.id, now);
  });
}

function countUsers(db: Pick<Db, 'select'>): number {
  return db.select({ n: count() }).from(users).get()?.n ?? 0;
}
