/**
 * Browser-tab titles per route (issue 17, item 7) and the register's headings and tab row per tab
 * (item 6).
 *
 * Outside references:
 *  - WCAG 2.2, success criterion 2.4.2 "Page Titled" (Level A): each page has a title that describes its
 *    topic or purpose (from memory); putting the page's object first, so tabs and history entries read by
 *    their first words tell pages apart, is common practice (a usability convention, not the standard);
 *  - the pattern itself is the issue's own example, "Tidebreaker — Review · Pivotwatch";
 *  - react-helmet-async (Expo Router's Head on the web) keeps the innermost, last mounted title: the last
 *    <title> in tree order here (its documented behaviour: "nested or latter components will override
 *    duplicate changes"). The real document.title is checked in tests/browser/page-titles.test.ts.
 * Companies and people are the invented demo scenario.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

import { screen, within } from 'expo-router/testing-library';
import { StyleSheet } from 'react-native';

import { ErrorBoundary } from '@/components/route-error';
import {
  composeTitle,
  objectAfter,
  objectIsHeading,
  objectLeadsSubtitle,
  titleFromHeading,
} from '@/components/route-title';
import type { SessionUser } from '@/features/session/schema';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { standInApi } from '@/tests/support/stand-in-api';

// The web's PageHead (Expo Router's Head around a <title>) stands in for the phone's, which draws nothing;
// Head itself renders its children so the <title> elements can be read from the tree.
jest.mock('@/components/page-head', () => jest.requireActual('@/components/page-head.web'));
jest.mock('expo-router/head', () => ({
  __esModule: true,
  default: ({ children }: { children: React.ReactNode }) => children,
}));
jest.mock('@/features/session/token-store', () => ({
  tokenStore: {
    get: async () => ({ token: 'token-of-tester', expiresAt: '2099-01-01T00:00:00.000Z', user: null }),
    set: async () => {},
    clear: async () => {},
  },
}));
let mockWide = false;
jest.mock('@/components/use-wide', () => ({ useWide: () => mockWide }));

const ROOT = join(__dirname, '..', '..');
const admin: SessionUser = {
  id: 'u-adm',
  email: 'admin@pivotwatch.test',
  name: 'Rowan Ashby',
  role: 'admin',
  companyId: null,
  companyName: null,
};

type Node = { type: unknown; props: { children?: unknown } };
/** The title the browser would show: the last <title> in the tree (see the header). */
function tabTitle(root: { findAll: (p: (n: Node) => boolean) => Node[] }): string | undefined {
  const titles = root.findAll((n) => n.type === 'title');
  return titles.length ? String(titles[titles.length - 1].props.children) : undefined;
}

describe('the title pattern', () => {
  test('object — page · product, as in the issue’s example', () => {
    expect(composeTitle('Review', 'Tidebreaker')).toBe('Tidebreaker — Review · Pivotwatch');
    expect(composeTitle('Sign in')).toBe('Sign in · Pivotwatch');
  });

  test('the object is found where each kind of heading puts it', () => {
    const review = { page: 'Review', object: objectLeadsSubtitle };
    expect(
      titleFromHeading(review, { title: 'Periodic inspection', subtitle: 'Tidebreaker · submitted 3 Dec' }),
    ).toBe('Tidebreaker — Review · Pivotwatch');
    const schedule = { page: 'Schedule', object: objectAfter('Schedule of ') };
    expect(titleFromHeading(schedule, { title: 'Schedule of Gullwing' })).toBe(
      'Gullwing — Schedule · Pivotwatch',
    );
    const person = { page: 'Person', object: objectIsHeading };
    expect(titleFromHeading(person, { title: 'Lena Marwick' })).toBe('Lena Marwick — Person · Pivotwatch');
    // While the object loads the heading is the page's own name: no "Person — Person".
    expect(titleFromHeading(person, { title: 'Person' })).toBe('Person · Pivotwatch');
    // A missing object says so, without a page name to contradict it.
    expect(titleFromHeading(person, { title: 'Ride not found' })).toBe('Ride not found · Pivotwatch');
    expect(titleFromHeading(schedule, { title: 'No such version' })).toBe('No such version · Pivotwatch');
  });
});

describe('every route has a title', () => {
  const routes: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (/\.tsx?$/.test(name) && !name.startsWith('_layout')) routes.push(relative(ROOT, path));
    }
  };
  walk(join(ROOT, 'app'));

  test('each route file wraps its screen with titled(…) and a page name', () => {
    expect(routes.length).toBeGreaterThan(40);
    const untitled = routes.filter(
      (r) => !/export default titled\(\w+, \{ page: '[^']+'/.test(readFileSync(join(ROOT, r), 'utf8')),
    );
    expect(untitled).toEqual([]);
  });

  test('routes that show an object say where its name is; the sign-in, not-found and error screens are named', () => {
    const text = (r: string) => readFileSync(join(ROOT, 'app', r), 'utf8');
    for (const r of [
      '(app)/review/[id].tsx',
      '(app)/rides/[id]/index.tsx',
      '(app)/notices/[id].tsx',
      '(app)/admin/people/[id].tsx',
      '(app)/inspect/[id].tsx',
    ])
      expect(text(r)).toMatch(/object: object(IsHeading|LeadsSubtitle|After)/);
    expect(text('(auth)/sign-in.tsx')).toMatch(/page: 'Sign in'/);
    expect(text('+not-found.tsx')).toMatch(/page: 'Page not found'/);
    expect(text('_layout.tsx')).toMatch(/export \{ ErrorBoundary \} from '@\/components\/route-error'/);
  });
});

describe('rendered routes', () => {
  // The routes' screens come through the shell's bundles, which on a phone (and in jest) are plain
  // imports of every area: load them once, outside any one test's time.
  beforeAll(() => {
    jest.requireActual('@/features/shell/lazy-screens');
  }, 120_000);
  beforeEach(() => {
    mockWide = false;
    standInApi(() => ({ status: 404, body: { error: { code: 'not_found', message: 'Nothing here' } } }));
  });
  afterEach(() => jest.restoreAllMocks());

  test('the not-found route and the error screen name the tab', async () => {
    const notFound = jest.requireActual('@/app/+not-found').default;
    const view = renderScreens(sessionClient(admin), { '+not-found': notFound }, '/no/such/page');
    await screen.findByText('This page does not exist');
    expect(tabTitle(view.UNSAFE_root)).toBe('Page not found · Pivotwatch');
    view.unmount();

    const failed = renderScreens(
      sessionClient(admin),
      {
        index: () => (
          <ErrorBoundary error={new Error('Pivotwatch could not load this page.')} retry={async () => {}} />
        ),
      },
      '/',
    );
    await screen.findByText(/could not load this page/);
    expect(tabTitle(failed.UNSAFE_root)).toBe('Page could not be shown · Pivotwatch');
  });

  // Each register tab's route, as the app has it (app/…), under the admin who sees every tab.
  const tabs = [
    { url: '/rides', route: 'rides/index', file: '(app)/rides/index', label: 'Rides' },
    {
      url: '/register/schedules',
      route: 'register/schedules',
      file: '(app)/register/schedules',
      label: 'Schedules',
    },
    { url: '/register/rounds', route: 'register/rounds', file: '(app)/register/rounds', label: 'Rounds' },
    {
      url: '/register/checklists',
      route: 'register/checklists/index',
      file: '(app)/register/checklists/index',
      label: 'Checklists',
    },
    {
      url: '/register/bulletins',
      route: 'register/bulletins/index',
      file: '(app)/register/bulletins/index',
      label: 'Bulletins',
    },
    {
      url: '/register/companies',
      route: 'register/companies/index',
      file: '(app)/register/companies/index',
      label: 'Companies',
    },
    {
      url: '/register/sites',
      route: 'register/sites/index',
      file: '(app)/register/sites/index',
      label: 'Sites',
    },
    {
      url: '/register/instruments',
      route: 'register/instruments',
      file: '(app)/register/instruments',
      label: 'Instruments',
    },
    { url: '/register/audit', route: 'register/audit', file: '(app)/register/audit', label: 'Audit log' },
  ];

  test.each(tabs)(
    '$url: heading, current tab and title all name "$label"',
    async ({ url, route, file, label }) => {
      const screenOf = jest.requireActual(`@/app/${file}`).default;
      const view = renderScreens(sessionClient(admin), { [route]: screenOf }, url);
      const heading = await screen.findByRole('header', { name: label });
      expect(heading).toBeTruthy();
      const nav = screen.getByLabelText('Register');
      const current = within(nav)
        .getAllByRole('link')
        .filter((l) => l.props['aria-current'] === 'page');
      expect(current).toHaveLength(1);
      expect(within(current[0]).getByText(label)).toBeTruthy();
      expect(tabTitle(view.UNSAFE_root)).toBe(`${label} · Pivotwatch`);
    },
  );

  test('on a phone the register’s eight tabs wrap onto rows, none past the edge', async () => {
    const screenOf = jest.requireActual('@/app/(app)/register/companies/index').default;
    renderScreens(sessionClient(admin), { 'register/companies/index': screenOf }, '/register/companies');
    await screen.findByRole('header', { name: 'Companies' });
    const nav = screen.getByLabelText('Register');
    expect(
      within(nav)
        .getAllByRole('link')
        .map((l) => within(l).getByText(/\w/).props.children),
    ).toEqual(tabs.map((t) => t.label));
    expect(StyleSheet.flatten(nav.props.style)).toMatchObject({ flexDirection: 'row', flexWrap: 'wrap' });
    expect(nav.props.horizontal).toBeUndefined();
  });
});
