/**
 * Accessibility checked by a machine (issue 17, item 11): axe-core runs on every screen each role can
 * reach, at phone (390×844) and desktop (1440×900) size, with the system set to light and to dark
 * (playwright's `colorScheme`, which the app's theme follows), plus the signed-out sign-in and
 * set-password pages. The rules are axe's WCAG 2.0/2.1 A and AA set (tags wcag2a, wcag2aa, wcag21a,
 * wcag21aa); any violation axe rates serious or critical fails the test, listed as
 * `[impact] rule · screen · target — what axe says`. Demo data is invented (the seeded parks and rides).
 */
import type { Browser, Page } from 'playwright-core';

import {
  type AxeExemption,
  type AxeFinding,
  axeViolations,
  formatFinding,
} from '@/tests/support/browser/axe';
import {
  DEMO_PASSWORD,
  apiGet,
  apiToken,
  serverAndBrowser,
  sizes,
  type SizeName,
  startPeriodicInspection,
} from '@/tests/support/browser/harness';

const app = serverAndBrowser({ NODE_ENV: 'development' });

type Role = 'inspector' | 'supervisor' | 'operator' | 'admin';
type Theme = 'light' | 'dark';
const themes: Theme[] = ['light', 'dark'];
const sizeNames: SizeName[] = ['phone', 'desktop'];

/** Elements whose markup we do not write, each with its reason. None so far. */
const exemptions: AxeExemption[] = [];

/** What the screens need: the seeded records' ids, a notice for the operator and an invitation link. */
type Fixtures = {
  rideId: string;
  operatorRideId: string;
  reviewId: string;
  noticeId: string;
  companyId: string;
  siteId: string;
  checklistId: string;
  personId: string;
  setPasswordPath: string;
};

/** `title`: the route's page name, which the browser tab shows ("… — Ride · Pivotwatch") once it is open. */
type Screen = { name: string; title: string; path: (f: Fixtures) => string; roles: readonly Role[] };
const all: Role[] = ['inspector', 'supervisor', 'operator', 'admin'];
const staff: Role[] = ['inspector', 'supervisor', 'admin'];
const desk: Role[] = ['supervisor', 'admin'];
const admin: Role[] = ['admin'];

/** Every route in app/(app) with each role its screen lets in (the RoleGate of each screen). */
const screens: Screen[] = [
  { name: 'Today', title: 'Today', path: () => '/today', roles: ['inspector'] },
  { name: 'My rides', title: 'My rides', path: () => '/my-rides', roles: ['operator'] },
  { name: 'Administration', title: 'Administration', path: () => '/admin', roles: admin },
  { name: 'People', title: 'People', path: () => '/admin/people', roles: admin },
  { name: 'Person', title: 'Person', path: (f) => `/admin/people/${f.personId}`, roles: admin },
  { name: 'Outbox', title: 'Outbox', path: () => '/admin/outbox', roles: admin },
  { name: 'Review queue', title: 'Review', path: () => '/review', roles: desk },
  { name: 'Inspection in review', title: 'Review', path: (f) => `/review/${f.reviewId}`, roles: desk },
  { name: 'Rides', title: 'Rides', path: () => '/rides', roles: all },
  { name: 'New ride', title: 'New ride', path: () => '/rides/new', roles: admin },
  { name: 'Ride', title: 'Ride', path: (f) => `/rides/${f.rideId}`, roles: staff },
  { name: 'Ride (operator)', title: 'Ride', path: (f) => `/rides/${f.operatorRideId}`, roles: ['operator'] },
  { name: 'Ride edit', title: 'Edit ride', path: (f) => `/rides/${f.rideId}/edit`, roles: desk },
  { name: 'Ride status', title: 'Status', path: (f) => `/rides/${f.rideId}/status`, roles: desk },
  { name: 'Ride schedule', title: 'Schedule', path: (f) => `/rides/${f.rideId}/schedule`, roles: desk },
  { name: 'Design data', title: 'Design data', path: (f) => `/rides/${f.rideId}/design`, roles: staff },
  {
    name: 'Design version',
    title: 'Design version',
    path: (f) => `/rides/${f.rideId}/versions/1`,
    roles: staff,
  },
  {
    name: 'Design import',
    title: 'Import design data',
    path: (f) => `/rides/${f.rideId}/import`,
    roles: desk,
  },
  { name: 'Running log', title: 'Running log', path: (f) => `/rides/${f.rideId}/log`, roles: staff },
  {
    name: 'Running log (operator)',
    title: 'Running log',
    path: (f) => `/rides/${f.operatorRideId}/log`,
    roles: ['operator'],
  },
  { name: 'NDT', title: 'NDT', path: (f) => `/rides/${f.rideId}/ndt`, roles: staff },
  {
    name: 'NDT (operator)',
    title: 'NDT',
    path: (f) => `/rides/${f.operatorRideId}/ndt`,
    roles: ['operator'],
  },
  { name: 'Logbook', title: 'Logbook', path: (f) => `/rides/${f.rideId}/logbook`, roles: staff },
  {
    name: 'Logbook (operator)',
    title: 'Logbook',
    path: (f) => `/rides/${f.operatorRideId}/logbook`,
    roles: ['operator'],
  },
  { name: 'Companies', title: 'Companies', path: () => '/register/companies', roles: staff },
  { name: 'Company', title: 'Company', path: (f) => `/register/companies/${f.companyId}`, roles: staff },
  { name: 'New company', title: 'New company', path: () => '/register/companies/new', roles: admin },
  {
    name: 'Company edit',
    title: 'Edit company',
    path: (f) => `/register/companies/${f.companyId}/edit`,
    roles: admin,
  },
  { name: 'Sites', title: 'Sites', path: () => '/register/sites', roles: staff },
  { name: 'Site', title: 'Site', path: (f) => `/register/sites/${f.siteId}`, roles: staff },
  { name: 'New site', title: 'New site', path: () => '/register/sites/new', roles: admin },
  { name: 'Site edit', title: 'Edit site', path: (f) => `/register/sites/${f.siteId}/edit`, roles: admin },
  { name: 'Checklists', title: 'Checklists', path: () => '/register/checklists', roles: staff },
  {
    name: 'Checklist',
    title: 'Checklist',
    path: (f) => `/register/checklists/${f.checklistId}`,
    roles: staff,
  },
  {
    name: 'Checklist version',
    title: 'Checklist version',
    path: (f) => `/register/checklists/${f.checklistId}/versions/1`,
    roles: staff,
  },
  {
    name: 'Checklist edit',
    title: 'Edit checklist',
    path: (f) => `/register/checklists/${f.checklistId}/edit`,
    roles: desk,
  },
  { name: 'New checklist', title: 'New checklist', path: () => '/register/checklists/new', roles: desk },
  { name: 'Instruments', title: 'Instruments', path: () => '/register/instruments', roles: staff },
  { name: 'Schedules', title: 'Schedules', path: () => '/register/schedules', roles: desk },
  { name: 'Rounds', title: 'Rounds', path: () => '/register/rounds', roles: desk },
  { name: 'Audit log', title: 'Audit log', path: () => '/register/audit', roles: desk },
  { name: 'Notices', title: 'Notices', path: () => '/notices', roles: all },
  { name: 'Notice', title: 'Notice', path: (f) => `/notices/${f.noticeId}`, roles: all },
  { name: 'Load check', title: 'Load check', path: () => '/loads', roles: staff },
  { name: 'Account', title: 'Account', path: () => '/account', roles: all },
];

/**
 * The screen has drawn what it was waiting for: the tab names the route and a level-1 heading is on the
 * page; then up to 10 s for the spinners in view to go, since a photo or a chart below the fold may
 * load only when scrolled to (a bar with a value is no spinner). Fails on a screen that could not load.
 */
async function settled(page: Page, screen: string, title: string) {
  await page
    .waitForFunction(
      (t) =>
        document.title.endsWith(`${t} · Pivotwatch`) &&
        document.querySelector('h1, [role="heading"][aria-level="1"]') !== null,
      title,
      { timeout: 30_000, polling: 100 },
    )
    .catch(async () => {
      throw new Error(`${screen} did not open: tab "${await page.title()}" at ${page.url()}`);
    });
  const still = () =>
    !Array.from(
      // components/spinner.tsx marks its spinners; an unmarked bar without a value or a name is one too.
      document.querySelectorAll(
        '[data-testid="spinner"], [role="progressbar"]:not([aria-valuenow]):not([aria-label])',
      ),
    ).some((el) => {
      const r = el.getBoundingClientRect();
      return (
        r.width > 0 &&
        r.bottom > 0 &&
        r.top < window.innerHeight &&
        getComputedStyle(el).visibility !== 'hidden'
      );
    });
  await page.waitForFunction(still, undefined, { timeout: 10_000, polling: 100 }).then(
    () => undefined,
    () => console.warn(`accessibility: ${screen} still shows a spinner after 10 s`),
  );
  const broken = await page
    .getByText(/^(This could not be loaded\.|Not part of your role|Page not found)$/)
    .count();
  if (broken) throw new Error(`${screen} did not load: ${await page.locator('body').innerText()}`);
}

/**
 * Opens a path inside the running app, as its own links do (history.pushState, then the popstate event
 * the router listens to), so the app is not started again for every screen.
 */
async function open(page: Page, path: string, screen: string, title: string) {
  await page.evaluate((p) => {
    window.history.pushState(window.history.state, '', p);
    window.dispatchEvent(new PopStateEvent('popstate', { state: window.history.state }));
  }, path);
  await settled(page, screen, title);
}

async function newPage(browser: Browser, size: SizeName, theme: Theme): Promise<Page> {
  const context = await browser.newContext({
    viewport: sizes[size],
    deviceScaleFactor: 1,
    colorScheme: theme,
  });
  const page = await context.newPage();
  page.on('pageerror', (err) => console.error(`[page error] ${err.message}`));
  return page;
}

/** Each finding once (the same element on the same screen in several runs is listed with its runs). */
function report(findings: AxeFinding[]): string[] {
  const byKey = new Map<string, string[]>();
  for (const f of findings) {
    const [screen, run] = f.screen.split(' @ ');
    const key = formatFinding({ ...f, screen });
    byKey.set(key, [...(byKey.get(key) ?? []), run]);
  }
  return [...byKey].map(([line, runs]) => `${line} (${runs.join(', ')})`);
}

let fixtures: Fixtures;
const started = Date.now();

beforeAll(async () => {
  const base = app.baseUrl;
  const supervisor = await apiToken(base, 'supervisor@pivotwatch.test');
  const adminToken = await apiToken(base, 'admin@pivotwatch.test');
  const operator = await apiToken(base, 'operator@pivotwatch.test');
  const get = <T>(path: string, token = supervisor) => apiGet<T>(base, path, token);

  const { rides } = await get<{ rides: { id: string; name: string }[] }>('/api/rides?pageSize=100');
  const { rides: own } = await get<{ rides: { id: string; name: string }[] }>(
    '/api/rides?pageSize=100',
    operator,
  );
  const { inspections } = await get<{ inspections: { id: string; rideName: string; reviewState: string }[] }>(
    '/api/inspections?pageSize=100',
  );
  const submitted = (name: string) =>
    inspections.find((i) => i.rideName === name && i.reviewState === 'submitted');
  const operatorRide = own.find((r) => r.name === 'Skylark');
  const toApprove = submitted('Skylark');
  const toReview = submitted('Tidebreaker');
  expect(operatorRide && toApprove && toReview).toBeTruthy();

  // A notice to the operator's company: the supervisor records a finding on Skylark's inspection and approves it.
  const headers = { authorization: `Bearer ${supervisor}`, 'content-type': 'application/json' };
  const finding = await fetch(`${base}/api/inspections/${toApprove!.id}/findings`, {
    method: 'POST',
    headers,
    body: JSON.stringify({
      severity: 'fix_before_operation',
      description: 'Gondola restraint latch sticks half-way on seat 4.',
      requiredAction: 'Free and lubricate the latch, then test it ten times.',
      dueOn: '2027-01-10',
    }),
  });
  expect(finding.status).toBe(201);
  const decision = await fetch(`${base}/api/inspections/${toApprove!.id}/decision`, {
    method: 'POST',
    headers,
    body: JSON.stringify({
      decision: 'approve',
      note: null,
      rideStatus: { status: 'out_of_service', reason: 'Restraint latch sticks.' },
    }),
  });
  expect(decision.status).toBe(200);
  const { notice } = (await decision.json()) as { notice: { id: string } | null };
  expect(notice).not.toBeNull();

  // An invitation, for the set-password page as its link opens it.
  const email = 'ines.harrowgate@halvard.test';
  const invite = await fetch(`${base}/api/admin/users`, {
    method: 'POST',
    headers: { authorization: `Bearer ${adminToken}`, 'content-type': 'application/json' },
    body: JSON.stringify({ email, name: 'Ines Harrowgate', role: 'inspector' }),
  });
  expect(invite.status).toBe(201);
  let link: string | undefined;
  for (let i = 0; i < 60 && !link; i++) {
    const { messages } = await get<{ messages: { id: string; to: string[] }[] }>(
      '/api/admin/outbox',
      adminToken,
    );
    const id = messages.find((m) => m.to.includes(email))?.id;
    if (id) {
      const full = await get<{ message: { text: string | null } }>(`/api/admin/outbox/${id}`, adminToken);
      link = /\/set-password\?token=[\w-]+/.exec(full.message.text ?? '')?.[0];
    } else await new Promise((r) => setTimeout(r, 250));
  }
  expect(link).toBeDefined();

  const { companies } = await get<{ companies: { id: string; rideCount: number }[] }>('/api/companies');
  const { sites } = await get<{ sites: { id: string; rideCount: number }[] }>('/api/sites');
  const { templates } = await get<{ templates: { id: string }[] }>('/api/checklist-templates');
  const { users } = await get<{ users: { id: string; email: string }[] }>('/api/admin/users', adminToken);
  fixtures = {
    rideId: rides.find((r) => r.name === 'Tidebreaker')!.id,
    operatorRideId: operatorRide!.id,
    reviewId: toReview!.id,
    noticeId: notice!.id,
    companyId: companies.find((c) => c.rideCount > 0)!.id,
    siteId: sites.find((s) => s.rideCount > 0)!.id,
    checklistId: templates[0].id,
    personId: users.find((u) => u.email === 'inspector@pivotwatch.test')!.id,
    setPasswordPath: link!,
  };
});

afterAll(() => {
  console.log(`accessibility: ${((Date.now() - started) / 1000).toFixed(1)} s in all`);
});

/** The inspector's recording screen, each of its steps. */
async function inspectionSteps(page: Page, run: string): Promise<AxeFinding[]> {
  await open(page, '/today', 'Today', 'Today');
  await startPeriodicInspection(page, 'Little Kite');
  const steps = page.getByRole('radiogroup', { name: 'Part of the inspection' }).getByRole('radio');
  await steps.first().waitFor({ timeout: 30_000 });
  const found: AxeFinding[] = [];
  for (const step of await steps.all()) {
    const name = (await step.getAttribute('aria-label')) ?? (await step.innerText());
    await step.click();
    await settled(page, 'Inspection', 'Inspection');
    found.push(...(await axeViolations(page, `Inspection, step ${name.trim()} @ ${run}`, exemptions)));
  }
  return found;
}

/** Signs in once per theme at one size and checks every screen the role reaches. */
async function checkRole(role: Role, size: SizeName): Promise<AxeFinding[]> {
  const found: AxeFinding[] = [];
  for (const theme of listed(process.env.A11Y_THEMES, themes)) {
    const run = `${size} ${theme}`;
    const page = await newPage(app.browser, size, theme);
    await page.goto(`${app.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(`${role}@pivotwatch.test`);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 30_000 });
    for (const screen of screens.filter((s) => s.roles.includes(role) && only(s.name))) {
      const t0 = Date.now();
      await open(page, screen.path(fixtures), screen.name, screen.title);
      const t1 = Date.now();
      found.push(...(await axeViolations(page, `${screen.name} @ ${run}`, exemptions)));
      if (process.env.A11Y_TIMES)
        console.log(`${role} ${run} ${screen.name}: load ${t1 - t0} ms, axe ${Date.now() - t1} ms`);
    }
    if (role === 'inspector' && only('Inspection')) found.push(...(await inspectionSteps(page, run)));
    await page.context().close();
  }
  return found;
}

/**
 * While fixing, a narrower run: A11Y_SCREENS (a regular expression on the screen names), A11Y_ROLES,
 * A11Y_SIZES and A11Y_THEMES (comma-separated). `npm test` sets none of them and checks everything.
 */
const screenFilter = process.env.A11Y_SCREENS ? new RegExp(process.env.A11Y_SCREENS) : null;
const only = (name: string) => !screenFilter || screenFilter.test(name);
const listed = <T extends string>(env: string | undefined, values: readonly T[]): readonly T[] =>
  env ? values.filter((v) => env.split(',').includes(v)) : values;

const runs = listed(process.env.A11Y_ROLES, all).flatMap((role) =>
  listed(process.env.A11Y_SIZES, sizeNames).map((size) => [role, size] as const),
);

// One test per role and size, each with 5 minutes: an administrator's 35 screens in two themes took
// over jest's default 2 minutes on a busy machine.
test.each(runs)(
  'every screen of the %s at %s size has no serious or critical violations',
  async (role, size) => {
    const t0 = Date.now();
    const found = await checkRole(role, size);
    console.log(`accessibility: ${role} at ${size} size, ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    expect(report(found)).toEqual([]);
  },
  300_000,
);
