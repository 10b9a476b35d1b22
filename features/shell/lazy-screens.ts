/**
 * Every signed-in screen as a lazy component: the routes in app/(app) re-export these, so the entry bundle
 * holds only the shell, sign-in and set-password, and each area's screens load when first opened (the
 * split points are in bundle-loaders.web.ts).
 */
import { loadSignedInFonts } from '@/components/app-fonts';
import { tokenStore } from '@/features/session';
import type { Role } from '@/features/session/schema';
import {
  account,
  admin,
  calculator,
  frame,
  inspector,
  notices,
  operator,
  review,
  rides,
  scan,
} from '@/features/shell/bundle-loaders';
import { type BundleLoader, lazyScreen, loadBundle } from '@/features/shell/lazy-screen';
import { backgroundMoment } from '@/features/shell/load-shared';

/** The bundle of each role's home (the first page after signing in). */
const homeBundle: Record<Role, BundleLoader<unknown>> = { inspector, supervisor: review, operator, admin };

/** Every area each role's navigation reaches (features/shell/nav-items.ts). */
const roleAreas: Record<Role, BundleLoader<unknown>[]> = {
  inspector: [inspector, rides, notices, calculator, account],
  supervisor: [review, rides, notices, calculator, account],
  operator: [operator, notices, account],
  admin: [admin, rides, notices, calculator, account],
};

/**
 * Starts loading the signed-in frame and the role's home together as soon as the session is known, so
 * the two arrive in parallel rather than one after the other. Then, in the background, the rest of the
 * role's areas: a signal lost right after signing in, before the service worker holds the app, must not
 * leave one of the role's pages unreachable (it never did when the app was one bundle).
 */
export function preloadSignedIn(role: Role): void {
  if (startedFor === role) {
    // Already started for the stored session as the app started (preloadStoredSession); the session the
    // server confirms is normally that one. Only the first confirmation is spared: a later sign-in starts
    // again as before.
    startedFor = null;
    return;
  }
  startedFor = null;
  // The figures' face and the icons (the pages before sign-in draw neither).
  loadSignedInFonts();
  // An inspector's device database (its worker and .wasm) starts opening as soon as the frame's code is
  // here, alongside the home screen's chunk, rather than once the frame has rendered.
  const framed = loadBundle(frame).then((m) => m.warmUp(role));
  Promise.all([framed, loadBundle(homeBundle[role])])
    .then(backgroundMoment)
    .then(async (ahead) => {
      if (ahead) for (const area of roleAreas[role]) await loadBundle(area);
    })
    // A failure shows where the component renders (the route's own error, with a retry); nothing to do here.
    .catch(() => undefined);
}

/** The role whose areas `preloadStoredSession` started loading, until the session is confirmed. */
let startedFor: Role | null = null;

/**
 * On a reload of a signed-in page (the usual way back to a phone's app, often with no signal), starts
 * loading the stored person's frame and home while the first render runs, instead of after the session
 * is confirmed: an inspector's device database then opens in its worker alongside that work. Should the
 * server answer with someone else or no one, the page shows what it answers (the chunks only arrived
 * early). Called once as the app starts (root-layout.tsx).
 */
export function preloadStoredSession(): void {
  tokenStore
    .get()
    .then((stored) => {
      if (!stored) return;
      preloadSignedIn(stored.user.role);
      startedFor = stored.user.role;
    })
    .catch(() => undefined);
}

/** The session turned out to be no one's (ended, or signed out): whoever signs in next starts afresh. */
export function forgetStoredSessionPreload(): void {
  startedFor = null;
}

export const SignedInFrame = lazyScreen(frame, 'SignedInFrame');

export const TodayScreen = lazyScreen(inspector, 'TodayScreen');
export const InspectRoute = lazyScreen(inspector, 'InspectRoute');
// Not among any role's areas: the camera's code and its decoder load when Scan (or a plate) is opened.
export const ScanScreen = lazyScreen(scan, 'ScanScreen');
export const PlateScreen = lazyScreen(scan, 'PlateScreen');

export const QueueScreen = lazyScreen(review, 'QueueScreen');
export const InspectionReviewScreen = lazyScreen(review, 'InspectionReviewScreen');

export const RidesListScreen = lazyScreen(rides, 'RidesListScreen');
export const RideCreateScreen = lazyScreen(rides, 'RideCreateScreen');
export const RideDetailScreen = lazyScreen(rides, 'RideDetailScreen');
export const RideEditScreen = lazyScreen(rides, 'RideEditScreen');
export const RideStatusScreen = lazyScreen(rides, 'RideStatusScreen');
export const RideScheduleScreen = lazyScreen(rides, 'RideScheduleScreen');
export const DesignScreen = lazyScreen(rides, 'DesignScreen');
export const DesignImportScreen = lazyScreen(rides, 'DesignImportScreen');
export const DesignEditScreen = lazyScreen(rides, 'DesignEditScreen');
export const DesignVersionScreen = lazyScreen(rides, 'DesignVersionScreen');
export const RunningLogScreen = lazyScreen(rides, 'RunningLogScreen');
export const NdtScreen = lazyScreen(rides, 'NdtScreen');
export const LogbookScreen = lazyScreen(rides, 'LogbookScreen');
export const PartsScreen = lazyScreen(rides, 'PartsScreen');
export const AuditScreen = lazyScreen(rides, 'AuditScreen');
export const ChecklistsListScreen = lazyScreen(rides, 'ChecklistsListScreen');
export const ChecklistCreateScreen = lazyScreen(rides, 'ChecklistCreateScreen');
export const ChecklistScreen = lazyScreen(rides, 'ChecklistScreen');
export const ChecklistEditScreen = lazyScreen(rides, 'ChecklistEditScreen');
export const CompaniesListScreen = lazyScreen(rides, 'CompaniesListScreen');
export const CompanyScreen = lazyScreen(rides, 'CompanyScreen');
export const CompanyEditScreen = lazyScreen(rides, 'CompanyEditScreen');
export const SitesListScreen = lazyScreen(rides, 'SitesListScreen');
export const SiteScreen = lazyScreen(rides, 'SiteScreen');
export const SiteEditScreen = lazyScreen(rides, 'SiteEditScreen');
export const SchedulesListScreen = lazyScreen(rides, 'SchedulesListScreen');
export const RoundsScreen = lazyScreen(rides, 'RoundsScreen');
export const InstrumentRegisterScreen = lazyScreen(rides, 'InstrumentRegisterScreen');
export const BulletinsListScreen = lazyScreen(rides, 'BulletinsListScreen');
export const BulletinScreen = lazyScreen(rides, 'BulletinScreen');
export const BulletinEditScreen = lazyScreen(rides, 'BulletinEditScreen');

export const NoticeListScreen = lazyScreen(notices, 'NoticeListScreen');
export const NoticeScreen = lazyScreen(notices, 'NoticeScreen');
export const RideIncidentsScreen = lazyScreen(notices, 'RideIncidentsScreen');
export const IncidentReportScreen = lazyScreen(notices, 'IncidentReportScreen');
export const IncidentScreen = lazyScreen(notices, 'IncidentScreen');

export const OperatorHome = lazyScreen(operator, 'OperatorHome');
export const DailyCheckScreen = lazyScreen(operator, 'DailyCheckScreen');

export const AdminHome = lazyScreen(admin, 'AdminHome');
export const PeopleScreen = lazyScreen(admin, 'PeopleScreen');
export const PersonScreen = lazyScreen(admin, 'PersonScreen');
export const OutboxScreen = lazyScreen(admin, 'OutboxScreen');

export const CalculatorScreen = lazyScreen(calculator, 'CalculatorScreen');

export const AccountScreen = lazyScreen(account, 'AccountScreen');
