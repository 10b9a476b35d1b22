import { count, eq } from 'drizzle-orm';

import { auditLog, checklistTemplateVersions } from '@/db/server/schema';
import {
  checklistTemplateListResponseSchema,
  checklistTemplateResponseSchema,
  checklistVersionListResponseSchema,
} from '@/features/registry/schema';
import { rideClasses } from '@/features/rides/schema';
import { auditRowOrder } from '@/server/registry/audit-query';

import { expectApiError, makeTestServer, type TestServer } from './helpers';
import { demoClients, type Clients } from './registry-helpers';

let server: TestServer;
let api: Clients;
beforeAll(async () => {
  server = await makeTestServer();
  api = await demoClients(server.app);
});
afterAll(() => server.close());

const versionRows = () => server.db.select({ n: count() }).from(checklistTemplateVersions).get()?.n;

const areaTitles = [
  'Structure and welds',
  'Pins and bushings',
  'Bolted joints',
  'Rider restraints',
  'Drive and brakes',
  'Electrical and controls',
  'Signage and access',
  'Documents',
];

describe('demo templates', () => {
  test('one general template per ride class, each with the eight areas, readable by an inspector', async () => {
    const res = await api.inspector.get('/api/checklist-templates');
    expect(res.status).toBe(200);
    const all = checklistTemplateListResponseSchema.parse(res.body).templates;
    // Besides these, each class has its operators' daily check (tests/server/daily-checks.test.ts).
    const templates = all.filter((t) => t.inspectionType === null);
    expect(templates.map((t) => t.rideClass).sort()).toEqual([...rideClasses].sort());
    expect(
      all
        .filter((t) => t.inspectionType === 'daily_pre_opening')
        .map((t) => t.rideClass)
        .sort(),
    ).toEqual([...rideClasses].sort());
    for (const summary of templates) {
      expect(summary).toMatchObject({
        currentVersion: 1,
        areaCount: 8,
        archivedAt: null,
        updatedByName: 'Rowan Ashby',
      });
      const { template } = checklistTemplateResponseSchema.parse(
        (await api.inspector.get(`/api/checklist-templates/${summary.id}`)).body,
      );
      expect(template.version.content.areas.map((a) => a.title)).toEqual(areaTitles);
      const items = template.version.content.areas.flatMap((a) => a.items);
      expect(items.length).toBe(summary.itemCount);
      expect(items.some((i) => i.photoRequired)).toBe(true);
      // Every measurement item says what it measures.
      for (const item of items.filter((i) => i.measurementRequired))
        expect(item.measurementKind).not.toBeNull();
    }
  });

  test('filter by class', async () => {
    const { templates } = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates?rideClass=wheel')).body,
    );
    expect(templates.map((t) => t.name).sort()).toEqual([
      'Wheel — periodic inspection',
      'Wheel — pre-opening daily check',
    ]);
    const daily = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates?rideClass=wheel&inspectionType=daily_pre_opening'))
        .body,
    ).templates;
    expect(daily.map((t) => t.name)).toEqual(['Wheel — pre-opening daily check']);
    expectApiError(
      await api.inspector.get('/api/checklist-templates?rideClass=coaster'),
      400,
      'validation_failed',
    );
  });
});

describe('editing, versions and archiving', () => {
  let id = '';

  test('create: new areas and items get ids, flags default to false', async () => {
    const res = await api.supervisor.post('/api/checklist-templates', {
      name: 'Pendulum swing — set-up after assembly',
      rideClass: 'pendulum_swing',
      content: {
        areas: [
          {
            title: 'Pins and bushings',
            items: [
              { text: 'All pins fitted with their retainers after assembly', photoRequired: true },
              {
                text: 'Main pivot clearance',
                measurementRequired: true,
                measurementKind: 'lengthSmall',
                measurementLabel: 'load reversed',
              },
            ],
          },
        ],
      },
    });
    expect(res.status).toBe(201);
    const { template } = checklistTemplateResponseSchema.parse(res.body);
    id = template.id;
    const [area] = template.version.content.areas;
    expect(area.id).toMatch(/^area-/);
    expect(area.items.map((i) => i.id)).toEqual([
      expect.stringMatching(/^item-/),
      expect.stringMatching(/^item-/),
    ]);
    expect(area.items[0]).toMatchObject({ photoRequired: true, measurementRequired: false, guidance: null });
    expect(template.version).toMatchObject({ version: 1, createdByName: 'Mira Delacourt' });
  });

  test('a new version keeps the ids it is given; the old version stays readable', async () => {
    const { template: v1 } = checklistTemplateResponseSchema.parse(
      (await api.inspector.get(`/api/checklist-templates/${id}`)).body,
    );
    const area = v1.version.content.areas[0];
    const res = await api.admin.put(`/api/checklist-templates/${id}`, {
      reason: 'Add the bolt check',
      basedOnVersion: 1,
      content: {
        areas: [{ ...area, items: [...area.items, { text: 'Tower base bolts torqued after assembly' }] }],
      },
    });
    expect(res.status).toBe(200);
    const { template: v2 } = checklistTemplateResponseSchema.parse(res.body);
    expect(v2.currentVersion).toBe(2);
    expect(v2.version.content.areas[0].items.slice(0, 2)).toEqual(area.items);
    expect(v2.version.content.areas[0].items).toHaveLength(3);

    const versions = checklistVersionListResponseSchema.parse(
      (await api.inspector.get(`/api/checklist-templates/${id}/versions`)).body,
    );
    expect(versions.versions.map((v) => [v.version, v.reason])).toEqual([
      [2, 'Add the bolt check'],
      [1, 'New template'],
    ]);
    const old = checklistTemplateResponseSchema.parse(
      (await api.inspector.get(`/api/checklist-templates/${id}/versions/1`)).body,
    );
    expect(old.template.version.content).toEqual(v1.version.content);
    expect(old.template.currentVersion).toBe(2);
  });

  test('bad content → 400 naming the fields; stale version → 409; nothing saved', async () => {
    const before = versionRows();
    const error = expectApiError(
      await api.admin.put(`/api/checklist-templates/${id}`, {
        reason: 'Broken',
        content: {
          areas: [
            {
              title: 'Pins',
              items: [
                { id: 'same', text: 'A', measurementRequired: true },
                { id: 'same', text: '' },
              ],
            },
          ],
        },
      }),
      400,
      'validation_failed',
    );
    // Every problem at once, the duplicate id too.
    expect(error.issues?.map((i) => i.path).sort()).toEqual([
      'content.areas.0.items.0.measurementKind',
      'content.areas.0.items.1.id',
      'content.areas.0.items.1.text',
    ]);
    const duplicate = expectApiError(
      await api.admin.put(`/api/checklist-templates/${id}`, {
        reason: 'Duplicate ids',
        content: {
          areas: [
            {
              title: 'Pins',
              items: [
                { id: 'same', text: 'A' },
                { id: 'same', text: 'B' },
              ],
            },
          ],
        },
      }),
      400,
      'validation_failed',
    );
    expect(duplicate.issues).toEqual([
      { path: 'content.areas.0.items.1.id', message: 'Id same is used twice' },
    ]);
    expectApiError(
      await api.admin.put(`/api/checklist-templates/${id}`, {
        reason: 'Stale',
        basedOnVersion: 1,
        content: { areas: [{ title: 'Pins', items: [{ text: 'A' }] }] },
      }),
      409,
      'version_conflict',
    );
    expect(versionRows()).toBe(before);
  });

  test('delete archives: gone from the list, still readable, no more versions', async () => {
    expect((await api.supervisor.delete(`/api/checklist-templates/${id}`)).status).toBe(204);
    const list = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates')).body,
    );
    expect(list.templates.map((t) => t.id)).not.toContain(id);
    const all = checklistTemplateListResponseSchema.parse(
      (await api.inspector.get('/api/checklist-templates?includeArchived=true')).body,
    );
    expect(all.templates.find((t) => t.id === id)?.archivedAt).toEqual(expect.any(String));
    expect((await api.inspector.get(`/api/checklist-templates/${id}`)).status).toBe(200);
    expectApiError(
      await api.admin.put(`/api/checklist-templates/${id}`, {
        reason: 'Too late',
        content: { areas: [{ title: 'Pins', items: [{ text: 'A' }] }] },
      }),
      409,
      'archived',
    );
  });

  test('each change is in the audit log', () => {
    const actions = server.db
      .select({ action: auditLog.action })
      .from(auditLog)
      .where(eq(auditLog.entityId, id))
      .orderBy(auditRowOrder)
      .all()
      .map((e) => e.action);
    expect(actions).toEqual(['create', 'update', 'delete']);
  });

  test('unknown template → 404', async () => {
    expectApiError(await api.inspector.get('/api/checklist-templates/nope'), 404, 'not_found');
    expectApiError(await api.inspector.get('/api/checklist-templates/nope/versions'), 404, 'not_found');
  });
});
