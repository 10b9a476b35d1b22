/**
 * The register's delete action and the design-data field editor against a stand-in API: what each asks
 * before it sends anything, what it sends, and what it shows back. Names are invented demo data.
 *
 * The editor reads its fields back with the import's own reader, so the messages checked here are the
 * ones features/registry/README.md documents for a file (a decimal comma, "Required", a minimum pin
 * diameter not below the nominal). The changed pin force is compared with the design-diff rule the
 * server uses to hold a loosening revision for a second person (a raised maximum loosens it).
 */
import type { QueryClient } from '@tanstack/react-query';
import { act, fireEvent, screen, waitFor } from 'expo-router/testing-library';

import { InstrumentRegisterScreen } from '@/features/instruments/register-screen';
import { DesignEditScreen } from '@/features/registry/design-edit-screen';
import { RideScheduleScreen } from '@/features/registry/ride-schedule-screen';
import { SiteScreen } from '@/features/registry/site-screen';
import { SitesListScreen } from '@/features/registry/sites-list-screen';
import type { DesignVersion } from '@/features/registry/schema';
import type { SessionUser } from '@/features/session/schema';

import { makeRideSummary } from '@/tests/support/inspection-fixtures';
import { renderScreens, sessionClient } from '@/tests/support/app-screens';
import { rodDesign } from '@/tests/support/rod-design';
import { ok, standInApi } from '@/tests/support/stand-in-api';

jest.setTimeout(30_000);

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));

const user = (role: SessionUser['role']): SessionUser => ({
  id: `u-${role}`,
  email: `${role}@halvard.test`,
  name: `Demo ${role}`,
  role,
  companyId: null,
  companyName: null,
});

const clients: QueryClient[] = [];
const client = (role: SessionUser['role'] = 'admin') => {
  const c = sessionClient(user(role));
  clients.push(c);
  return c;
};
afterEach(() => {
  for (const c of clients.splice(0)) c.clear();
  jest.restoreAllMocks();
});

const site = {
  id: 's-1',
  name: 'Brackley Meadow',
  kind: 'fairground',
  address: null,
  locality: 'Brackley',
  timeZone: null,
  effectiveTimeZone: 'Europe/London',
  operatorCompanyId: 'op-2',
  operatorName: 'Corvane Travelling Shows',
  createdAt: '2026-11-20T09:30:00.000Z',
  rideCount: 0,
};
const emptyRides = { rides: [], total: 0, page: 1, pageSize: 100 };
const siteScreens = { 'register/sites/[id]': SiteScreen, 'register/sites/index': SitesListScreen };

describe('deleting a site', () => {
  test('asks first, naming the site; Cancel sends nothing; the second step deletes and the list says so', async () => {
    const api = standInApi({
      '/api/sites/s-1': (call) => (call.method === 'DELETE' ? { status: 204 } : ok({ site })),
      '/api/rides': () => ok(emptyRides),
      '/api/sites': () => ok({ sites: [], total: 0, page: 1, pageSize: 25 }),
      '/api/companies': () => ok({ companies: [], total: 0, page: 1, pageSize: 200 }),
    });
    const router = renderScreens(client(), siteScreens, '/register/sites/s-1');
    fireEvent.press(await screen.findByRole('button', { name: 'Delete site…' }));

    expect(screen.getByText('Delete Brackley Meadow?')).toBeTruthy();
    expect(screen.getByText(/A site with rides on it stays/)).toBeTruthy();
    expect(api.callsTo('DELETE', '/api/sites/s-1')).toHaveLength(0);

    fireEvent.press(screen.getByRole('button', { name: 'Cancel' }));
    expect(screen.queryByText('Delete Brackley Meadow?')).toBeNull();
    expect(api.callsTo('DELETE', '/api/sites/s-1')).toHaveLength(0);

    fireEvent.press(screen.getByRole('button', { name: 'Delete site…' }));
    fireEvent.press(screen.getByRole('button', { name: 'Delete Brackley Meadow' }));
    await waitFor(() => expect(router.getPathname()).toBe('/register/sites'));
    expect(api.callsTo('DELETE', '/api/sites/s-1')).toHaveLength(1);
    expect(
      await screen.findByText('Brackley Meadow was deleted. The audit log keeps a record of it.'),
    ).toBeTruthy();
  });

  test('a refusal shows the server’s reason and keeps the page', async () => {
    const busy = { ...site, name: 'Tamsworth Pier', rideCount: 3 };
    const reason = 'Tamsworth Pier still has 3 ride(s). Move them to another site first.';
    standInApi({
      '/api/sites/s-1': (call) =>
        call.method === 'DELETE'
          ? { status: 409, body: { error: { code: 'in_use', message: reason } } }
          : ok({ site: busy }),
      '/api/rides': () => ok(emptyRides),
    });
    const router = renderScreens(client(), siteScreens, '/register/sites/s-1');
    fireEvent.press(await screen.findByRole('button', { name: 'Delete site…' }));
    fireEvent.press(screen.getByRole('button', { name: 'Delete Tamsworth Pier' }));
    expect(await screen.findByText(`Tamsworth Pier was not deleted. ${reason}`)).toBeTruthy();
    expect(router.getPathname()).toBe('/register/sites/s-1');
  });

  test('a supervisor, whom the server refuses, is not offered the action', async () => {
    standInApi({ '/api/sites/s-1': () => ok({ site }), '/api/rides': () => ok(emptyRides) });
    renderScreens(client('supervisor'), siteScreens, '/register/sites/s-1');
    await screen.findByText('Brackley Meadow');
    expect(screen.queryByRole('button', { name: 'Delete site…' })).toBeNull();
  });
});

// ——— the design-data field editor ———

const ride = makeRideSummary({ id: 'r-1', name: 'Gull Wing' });
const design: DesignVersion = {
  id: 'dv-1',
  version: 3,
  createdAt: '2026-11-20T09:30:00.000Z',
  createdByName: 'Demo admin',
  reason: 'Design report rev. A',
  origin: 'import_csv',
  approvalState: 'in_force',
  data: rodDesign(200, 4, 'Gull Wing design report'),
};

function editorApi(put = jest.fn(() => ({ status: 201, body: { design: { ...design, version: 4 } } }))) {
  const api = standInApi({
    '/api/rides/r-1': () => ok({ ride, design }),
    '/api/rides/r-1/design/pending': () => ok({ pending: null, current: design }),
    '/api/rides/r-1/design': (call) => (call.method === 'PUT' ? put() : ok({ design })),
  });
  return { api, put };
}
const openEditor = () =>
  renderScreens(
    client(),
    { 'rides/[id]/edit-design': DesignEditScreen, 'rides/[id]/design': () => null },
    '/rides/r-1/edit-design',
  );

describe('design data editor', () => {
  test('starts from the version in force; a bad value is refused on its field and nothing is sent', async () => {
    const { put } = editorApi();
    openEditor();
    const mass = await screen.findByLabelText('Rod · rod on body 0: Mass (kg)');
    expect(mass.props.value).toBe('200');

    // A rule of the schema (features/loads/design-schema.ts) under its field…
    fireEvent.changeText(screen.getByLabelText('Pivot 0 · Main pivot: Minimum pin diameter (m)'), '0.07');
    expect(await screen.findByText('Must be below the nominal diameter')).toBeTruthy();
    // …and cells the import could not read, each under its own field.
    fireEvent.changeText(mass, '212,5');
    expect(await screen.findByText('"212,5" uses a decimal comma: write 212.5')).toBeTruthy();
    fireEvent.changeText(screen.getByLabelText('Pivot 0 · Main pivot: Bearing length (m)'), '');
    expect(screen.getByText('Required')).toBeTruthy();
    expect(screen.getByText(/Some fields have problems/)).toBeTruthy();

    fireEvent.changeText(screen.getByLabelText('Why this version'), 'Trying values');
    const save = screen.getByRole('button', { name: 'Save as version 4' });
    expect(save.props.accessibilityState?.disabled).toBe(true);
    fireEvent.press(save);
    expect(put).not.toHaveBeenCalled();
  });

  test('a changed mass and a raised force limit are listed against the version in force and saved as one version', async () => {
    const { api } = editorApi();
    const router = openEditor();
    fireEvent.changeText(await screen.findByLabelText('Rod · rod on body 0: Mass (kg)'), '212.5');
    fireEvent.changeText(screen.getByLabelText('Pivot 0 · Main pivot: Max force (N)'), '25000');
    expect(screen.getByText('Changed: was 200')).toBeTruthy();
    // The comparison: the mass changed without a verdict, the raised maximum loosens the pin's limit.
    expect(
      await screen.findByText(/1 limit is looser than in version 3|A limit is looser than in/),
    ).toBeTruthy();
    const propose = screen.getByRole('button', { name: 'Propose version 4 for approval' });

    fireEvent.press(propose);
    expect(await screen.findByText('Say why: it is kept with the version.')).toBeTruthy();
    expect(api.callsTo('PUT', '/api/rides/r-1/design')).toHaveLength(0);

    fireEvent.changeText(screen.getByLabelText('Why this version'), 'Maker’s weighing of the rod');
    await act(async () => fireEvent.press(propose));
    await waitFor(() => expect(router.getPathname()).toBe('/rides/r-1/design'));
    const [sent] = api.callsTo('PUT', '/api/rides/r-1/design');
    const body = sent.body as { reason: string; basedOnVersion: number; data: typeof design.data };
    expect(body.basedOnVersion).toBe(3);
    expect(body.reason).toBe('Maker’s weighing of the rod');
    // Only the two fields differ from the version in force.
    expect(body.data).toEqual({
      ...design.data,
      parts: [{ ...design.data.parts[0], massKg: 212.5 }],
      pivots: [{ ...design.data.pivots[0], maxForceN: 25_000 }],
    });
  });
});

describe('deleting a schedule', () => {
  test('from its open card, after the confirmation; the page says what went and asks for the list again', async () => {
    const schedule = {
      id: 'sch-1',
      rideId: 'r-1',
      rideName: 'Gull Wing',
      rideClass: 'rotating_arm',
      rideStatus: 'in_service',
      siteName: null,
      operatorName: 'Tamsworth Pier Leisure',
      inspectionType: 'periodic',
      intervalDays: 90,
      lastDoneOn: null,
      dueOn: '2026-12-20',
      nextDueOn: '2026-12-20',
      dueStatus: 'upcoming',
      daysUntilDue: 16,
      assignedTo: null,
      assignedAt: null,
      notes: null,
      createdAt: '2026-11-20T09:30:00.000Z',
    };
    let deleted = false;
    const api = standInApi({
      '/api/rides/r-1': () => ok({ ride, design: null }),
      '/api/rides/r-1/schedules': () => ok({ schedules: deleted ? [] : [schedule] }),
      '/api/inspectors': () => ok({ inspectors: [] }),
      '/api/schedules/sch-1': (call) => {
        if (call.method !== 'DELETE') return undefined;
        deleted = true;
        return { status: 204 };
      },
    });
    renderScreens(client('supervisor'), { 'rides/[id]/schedule': RideScheduleScreen }, '/rides/r-1/schedule');
    fireEvent.press(await screen.findByRole('button', { name: 'Change or assign' }));
    fireEvent.press(screen.getByRole('button', { name: 'Delete schedule…' }));
    expect(screen.getByText('Delete Periodic schedule of Gull Wing?')).toBeTruthy();
    expect(api.callsTo('DELETE', '/api/schedules/sch-1')).toHaveLength(0);
    fireEvent.press(screen.getByRole('button', { name: 'Delete Periodic schedule of Gull Wing' }));
    expect(
      await screen.findByText(
        /Periodic schedule of Gull Wing was deleted\. The audit log keeps a record of it\./,
      ),
    ).toBeTruthy();
    expect(api.callsTo('DELETE', '/api/schedules/sch-1')).toHaveLength(1);
    await waitFor(() => expect(api.callsTo('GET', '/api/rides/r-1/schedules').length).toBeGreaterThan(1));
  });
});

describe('deleting an instrument', () => {
  test('only after the confirmation, which says readings keep their copy; the register reads anew', async () => {
    const instrument = {
      id: 'ins-1',
      name: 'Optical tachometer',
      serial: 'OT-4471',
      method: 'tachometer',
      kinds: ['speed'],
      calibratedOn: '2026-06-01',
      calibrationDueOn: '2027-06-01',
      notes: null,
      retiredAt: null,
      createdAt: '2026-06-01T08:00:00.000Z',
      updatedAt: '2026-06-01T08:00:00.000Z',
    };
    let deleted = false;
    const api = standInApi({
      '/api/instruments': () => ok({ instruments: deleted ? [] : [instrument] }),
      '/api/settings/declaration': () =>
        ok({ declaration: { text: 'I inspected it.', updatedAt: null, updatedByName: null } }),
      '/api/instruments/ins-1': (call) => {
        if (call.method !== 'DELETE') return undefined;
        deleted = true;
        return { status: 204 };
      },
    });
    renderScreens(
      client('admin'),
      { 'register/instruments': InstrumentRegisterScreen },
      '/register/instruments',
    );
    fireEvent.press(await screen.findByRole('button', { name: 'Edit Optical tachometer (OT-4471)' }));
    fireEvent.press(screen.getByRole('button', { name: 'Delete instrument…' }));
    expect(screen.getByText('Delete Optical tachometer (OT-4471)?')).toBeTruthy();
    expect(screen.getByText(/keep their own copy of its name, serial and calibration/)).toBeTruthy();
    expect(api.callsTo('DELETE', '/api/instruments/ins-1')).toHaveLength(0);
    fireEvent.press(screen.getByRole('button', { name: 'Delete Optical tachometer (OT-4471)' }));
    expect(
      await screen.findByText(
        'Optical tachometer (OT-4471) was deleted. The audit log keeps a record of it.',
      ),
    ).toBeTruthy();
    expect(api.callsTo('DELETE', '/api/instruments/ins-1')).toHaveLength(1);
    await waitFor(() => expect(screen.queryByText('Optical tachometer')).toBeNull());
  });
});
