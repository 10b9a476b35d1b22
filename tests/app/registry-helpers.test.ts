/**
 * Small pure helpers of the register screens: the import report read back from the API error, where a
 * server problem lands in a form, the audit log's field changes, and the design values' wording in the
 * person's units (conversion factors from mathjs through features/units, not typed here).
 */
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { changedFields, valueText } from '@/features/registry/audit-diff';
import { gRange, motionText, partGeometry, point } from '@/features/registry/design-format';
import { exportFileName, formatFromName, importReport } from '@/features/registry/import-report';
import { fieldsOf, pathInWords } from '@/components/form/server-errors';
import { registryKeys } from '@/features/registry/api';
import { toSearch } from '@/lib/list-params';

describe('import report', () => {
  test('rows and columns come back from the API’s paths, in file order, whole-file problems last', () => {
    // The error body documented in features/registry/README.md ("Error report").
    const err = new ApiRequestError(400, 'import_invalid', 'The file has 3 problems; nothing was saved.', [
      { path: 'motion', message: 'Joint 1 has no motion' },
      { path: 'row 7, mass_kg', message: 'Mass must be greater than 0' },
      { path: 'row 2', message: 'This row has 41 cells but the header has 40 columns' },
    ]);
    expect(importReport(err)).toEqual({
      message: 'The file has 3 problems; nothing was saved.',
      lines: [
        {
          row: 2,
          column: null,
          where: 'Row 2',
          message: 'This row has 41 cells but the header has 40 columns',
        },
        { row: 7, column: 'mass_kg', where: 'Row 7, column mass_kg', message: 'Mass must be greater than 0' },
        { row: null, column: null, where: 'motion', message: 'Joint 1 has no motion' },
      ],
    });
  });

  test('other errors are not import reports', () => {
    expect(importReport(new ApiRequestError(409, 'version_conflict', 'Someone saved first.'))).toBeNull();
    expect(importReport(new OfflineError(new Error('down')))).toBeNull();
  });

  test('file format from the name; export names as the server writes them', () => {
    expect(formatFromName('kite.JSON')).toBe('json');
    expect(formatFromName('kite.csv')).toBe('csv');
    expect(formatFromName('export')).toBe('csv');
    expect(exportFileName('Whirligig Chairs', 3, 'csv')).toBe('whirligig-chairs-design-v3.csv');
  });
});

describe('server problems in forms', () => {
  test('a path inside a plain field goes to that field; inside a list, to the row’s own input', () => {
    const fieldFor = fieldsOf(['name', 'noticeEmails'], ['contacts']);
    expect(fieldFor('name')).toBe('name');
    expect(fieldFor('noticeEmails.1')).toBe('noticeEmails');
    expect(fieldFor('contacts.0.email')).toBe('contacts.0.email');
    expect(fieldFor('query.page')).toBeNull();
  });

  test('paths read as words, counting from 1', () => {
    expect(
      pathInWords('content.areas.0.items.2.text', { areas: 'Area', items: 'Item', content: 'Content' }),
    ).toBe('Content › Area 1 › Item 3 › text');
  });
});

describe('audit changes', () => {
  test('an update lists only the fields that changed, with before and after', () => {
    const before = { id: 'r1', name: 'Skylark', status: 'in_service', statusReason: null, year: 2014 };
    const after = {
      id: 'r1',
      name: 'Skylark',
      status: 'restricted',
      statusReason: 'Bearing noise',
      year: 2014,
    };
    expect(changedFields(before, after)).toEqual([
      { field: 'status', before: 'in_service', after: 'restricted' },
      { field: 'statusReason', before: '—', after: 'Bearing noise' },
    ]);
  });

  test('a create has no "before"; long text is cut to one line, lists of records are counted', () => {
    const changes = changedFields(null, {
      name: 'Gull Wing',
      description: 'A'.repeat(200),
      contacts: [{ name: 'Dale' }, { name: 'Priya' }],
    });
    expect(changes[0]).toEqual({ field: 'name', before: null, after: 'Gull Wing' });
    expect(changes[1].after?.length).toBe(140);
    expect(changes[1].after?.endsWith('…')).toBe(true);
    expect(changes[2]).toEqual({ field: 'contacts', before: null, after: '2 entries' });
    expect(valueText(undefined)).toBe('—');
  });

  test('nested records are opened: a new design version names the revision that changed', () => {
    const data = (revision: string, parts: number) => ({
      source: { document: 'DR-PX6-002', revision },
      parts: Array.from({ length: parts }, (_, i) => ({ name: `Part ${i}` })),
    });
    expect(changedFields({ version: 1, data: data('A', 4) }, { version: 2, data: data('B', 5) })).toEqual([
      { field: 'version', before: '1', after: '2' },
      { field: 'data.source.revision', before: 'A', after: 'B' },
      { field: 'data.parts', before: '4 entries', after: '5 entries' },
    ]);
  });
});

describe('design values in words', () => {
  test('points in the system’s length unit (1 ft = 0.3048 m, international foot, via mathjs)', () => {
    expect(point([0, -15], 'si')).toBe('(0, -15.00) m');
    expect(point([3.048, 0], 'us')).toBe('(10.00, 0) ft');
  });

  test('motion: steady speed in rpm, swing as ± amplitude every period', () => {
    expect(motionText({ joint: 0, kind: 'constant', rpm: 12 }, 'si')).toBe('12.00 rpm');
    expect(motionText({ joint: 0, kind: 'swing', amplitudeRad: Math.PI / 2, periodS: 9.5 }, 'si')).toBe(
      '± 90.00° every 9.500 s',
    );
  });

  test('part geometry and rider limits', () => {
    expect(
      partGeometry({ kind: 'disc', body: 0, name: 'Hub', massKg: 2200, centreM: [0, 0], radiusM: 1.1 }, 'si'),
    ).toBe('centre (0, 0) m, radius 1.100 m');
    expect(gRange({ min: -1, max: 5 })).toBe('−1 to 5 g');
    expect(gRange({ max: 2 })).toBe('≤ 2 g');
    expect(gRange(undefined)).toBe('—');
  });
});

describe('query keys and parameters', () => {
  test('empty filters make no difference to the key or the URL', () => {
    expect(registryKeys.siteList({ q: '', operatorId: undefined, pageSize: 200 })).toEqual(
      registryKeys.siteList({ pageSize: 200 }),
    );
    expect(toSearch({ status: ['restricted', 'out_of_service'], q: '', page: 2 })).toBe(
      '?status=restricted%2Cout_of_service&page=2',
    );
  });

  test('every key sits under the register’s root, so one invalidation reaches them all', () => {
    for (const key of [
      registryKeys.company('c'),
      registryKeys.designVersion('r', 2),
      registryKeys.checklistVersion('t', 1),
      registryKeys.scheduleList({}),
      registryKeys.auditList({}),
    ])
      expect(key[0]).toBe('registry');
  });
});
