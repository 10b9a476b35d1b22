/**
 * The review desk's keyboard shortcuts (features/review/shortcuts.ts, use-shortcuts.web.ts, the queue
 * screen). The app project runs as a phone, so the web hook is loaded by its own name and the document it
 * listens on is stood in for by a plain object that hands key presses to the listener, with the element
 * the key went to as `target` (as a DOM KeyboardEvent carries it).
 *
 * Outside references for what is checked:
 * - WCAG 2.1 SC 2.1.4 "Character Key Shortcuts" (W3C Recommendation): single-character shortcuts must not
 *   fire while the person types, and can be turned off.
 * - HTML Living Standard: INPUT, TEXTAREA and SELECT take typed keys; an element with contenteditable does;
 *   Enter on a focused link follows it (the "activation behavior" of `a`), so the shortcut must leave it.
 * - WAI-ARIA 1.2: combobox, textbox, searchbox and spinbutton are roles a person types into; `aria-current`
 *   marks the current item of a set (used for the highlighted row, a link, where aria-selected is not allowed).
 * - j/k for next/previous, o or Enter to open and ? for the list of keys are common practice on mail and
 *   review desks (from memory, not from a standard).
 */
import { Text } from 'react-native';
import { act, fireEvent, screen, within } from 'expo-router/testing-library';

import { makeQueryClient } from '@/features/api/query-client';
import type { SessionUser } from '@/features/session/schema';
import { QueueScreen } from '@/features/review/queue-screen';
import { queueNeighbour } from '@/features/review/queue-order';
import { type QueueItem } from '@/features/review/schema';
import { isTypingTarget, shortcutFor, shortcutKeys, stepIndex } from '@/features/review/shortcuts';
import { holderOf, renderScreens, sessionClient } from '@/tests/support/app-screens';
import { ok, standInApi } from '@/tests/support/stand-in-api';

jest.mock('@/features/session/token-store', () => ({
  tokenStore: { get: async () => null, set: async () => {}, clear: async () => {} },
}));
jest.mock('@/features/review/use-shortcuts', () => jest.requireActual('@/features/review/use-shortcuts.web'));
jest.mock('@/components/use-wide', () => ({ useWide: () => true }));
jest.setTimeout(30_000);

// ——— the rules, without a screen ———

const el = (tagName: string, attrs: Record<string, string> = {}, editable = false) => ({
  tagName,
  isContentEditable: editable,
  getAttribute: (name: string) => attrs[name] ?? null,
});

describe('which key is a shortcut (features/review/shortcuts.ts)', () => {
  test('letters do nothing while the person types (WCAG 2.1 SC 2.1.4; HTML text-entry elements; ARIA roles)', () => {
    for (const target of [
      el('INPUT'),
      el('TEXTAREA'),
      el('SELECT'),
      el('DIV', {}, true),
      el('DIV', { role: 'combobox' }),
      el('DIV', { role: 'textbox' }),
      el('DIV', { role: 'searchbox' }),
    ]) {
      expect(isTypingTarget(target)).toBe(true);
      expect(shortcutFor({ key: 'j', target }, 'queue')).toBeNull();
      expect(shortcutFor({ key: 'a', target }, 'inspection')).toBeNull();
      expect(shortcutFor({ key: '?', target }, 'queue')).toBeNull();
    }
  });

  test('elsewhere the keys map as the help lists them; modifiers and handled presses are the browser’s', () => {
    const body = el('BODY');
    expect(shortcutFor({ key: 'j', target: body }, 'queue')).toBe('next');
    expect(shortcutFor({ key: 'ArrowDown', target: body }, 'queue')).toBe('next');
    expect(shortcutFor({ key: 'k', target: body }, 'queue')).toBe('previous');
    expect(shortcutFor({ key: 'ArrowUp', target: body }, 'queue')).toBe('previous');
    expect(shortcutFor({ key: 'o', target: body }, 'queue')).toBe('open');
    expect(shortcutFor({ key: 'Enter', target: body }, 'queue')).toBe('open');
    expect(shortcutFor({ key: '?', target: body }, 'queue')).toBe('help');
    expect(shortcutFor({ key: 'a', target: body }, 'inspection')).toBe('approve');
    expect(shortcutFor({ key: 'r', target: body }, 'inspection')).toBe('return');
    // Approving and returning are not keys of the queue; the arrows do not leave an inspection (they scroll).
    expect(shortcutFor({ key: 'a', target: body }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'ArrowDown', target: body }, 'inspection')).toBeNull();
    // Ctrl+K, Cmd+J, Alt+O stay the browser's.
    expect(shortcutFor({ key: 'k', ctrlKey: true, target: body }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'j', metaKey: true, target: body }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'o', altKey: true, target: body }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'j', defaultPrevented: true, target: body }, 'queue')).toBeNull();
  });

  test('Enter on a link or a button follows or presses it (HTML activation behaviour), not the highlight', () => {
    expect(shortcutFor({ key: 'Enter', target: el('A') }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'Enter', target: el('BUTTON') }, 'queue')).toBeNull();
    expect(shortcutFor({ key: 'Enter', target: el('DIV', { role: 'button' }) }, 'queue')).toBeNull();
    // o is no key of a link: it still opens the highlighted item.
    expect(shortcutFor({ key: 'o', target: el('A') }, 'queue')).toBe('open');
  });

  test('every key the help lists is read as its action, on both pages', () => {
    for (const page of ['queue', 'inspection'] as const)
      for (const row of shortcutKeys[page])
        for (const key of row.keys) expect(shortcutFor({ key, target: el('BODY') }, page)).toBe(row.action);
  });

  test('the highlight starts at the first item and stops at either end', () => {
    expect(stepIndex(-1, 3, 1)).toBe(0);
    expect(stepIndex(-1, 3, -1)).toBe(0);
    expect(stepIndex(0, 3, 1)).toBe(1);
    expect(stepIndex(2, 3, 1)).toBe(2);
    expect(stepIndex(0, 3, -1)).toBe(0);
    expect(stepIndex(-1, 0, 1)).toBe(-1);
  });
});

// ——— the hook on the queue screen ———

type Listener = (e: unknown) => void;
const listeners = new Set<Listener>();
const standInDocument = {
  addEventListener: (type: string, l: Listener) => type === 'keydown' && listeners.add(l),
  removeEventListener: (type: string, l: Listener) => listeners.delete(l),
};
const savedDocument = Object.getOwnPropertyDescriptor(globalThis, 'document');
beforeAll(() =>
  Object.defineProperty(globalThis, 'document', {
    value: standInDocument,
    configurable: true,
    writable: true,
  }),
);
afterAll(() => {
  if (savedDocument) Object.defineProperty(globalThis, 'document', savedDocument);
  else delete (globalThis as Record<string, unknown>).document;
});

/** A key pressed with `target` focused; says whether the page took it (preventDefault). */
function press(key: string, target: unknown = el('BODY')): boolean {
  let taken = false;
  const event = {
    key,
    target,
    preventDefault: () => {
      taken = true;
    },
  };
  act(() => listeners.forEach((l) => l(event)));
  return taken;
}

const supervisor: SessionUser = {
  id: 'u-sup',
  email: 'mara.quill@halvard.example',
  name: 'Mara Quill',
  role: 'supervisor',
  companyId: null,
  companyName: null,
};

const item = (n: number, kind: QueueItem['kind']): QueueItem => ({
  key: `${kind === 'inspection' ? 'i' : 'r'}:${n}`,
  kind,
  urgency: kind === 'inspection' ? 'awaiting' : 'overdue',
  inspectionId: kind === 'inspection' ? `insp-${n}` : null,
  inspectionType: kind === 'inspection' ? 'periodic' : null,
  rideId: `ride-${n}`,
  rideName: `Ride ${n}`,
  rideClass: 'wheel',
  rideStatus: 'in_service',
  siteId: 'site-1',
  siteName: 'Marrowby Wharf winter fair',
  operatorId: 'op-1',
  operatorName: 'Corvane Travelling Shows',
  inspectorId: null,
  inspectorName: null,
  at: '2026-12-03',
  analysisStatus: null,
  failedItems: 0,
  overdueSince: kind === 'ride' ? '2026-12-01' : null,
  findingsPastDue: 0,
});
const items = [item(1, 'inspection'), item(2, 'ride'), item(3, 'inspection')];
const counts = {
  incident_serious: 0,
  incident: 0,
  over: 0,
  failed: 0,
  near: 0,
  overdue: 1,
  past_due: 0,
  awaiting: 2,
};

let client: ReturnType<typeof makeQueryClient> | null = null;
beforeEach(() => {
  listeners.clear();
  standInApi({
    '/api/review/queue': () => ok({ items, total: 3, counts, page: 1, pageSize: 25 }),
    '/api/sites': () => ok({ sites: [], total: 0, page: 1, pageSize: 200 }),
    '/api/companies': () => ok({ companies: [], total: 0, page: 1, pageSize: 200 }),
    '/api/inspectors': () => ok({ inspectors: [] }),
  });
});
afterEach(() => {
  client?.clear();
  client = null;
  jest.restoreAllMocks();
});

function renderQueue() {
  client = sessionClient(supervisor);
  return renderScreens(
    client,
    {
      'review/index': QueueScreen,
      'review/[id]': () => <Text>Review desk of one inspection</Text>,
      'rides/[id]': () => <Text>Page of one ride</Text>,
    },
    '/review',
  );
}

const rows = () =>
  screen.getAllByRole('link').filter((l) => /^(Awaiting|Overdue)/.test(l.props.accessibilityLabel));
const highlighted = () => rows().findIndex((r) => holderOf(r).props['aria-current'] === 'true');

describe('the queue’s keys (use-shortcuts.web.ts on features/review/queue-screen.tsx)', () => {
  test('j/k move one highlight through the rows; keys typed into a field or combobox move nothing', async () => {
    renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    expect(highlighted()).toBe(-1);
    expect(press('j')).toBe(true);
    expect(highlighted()).toBe(0);
    press('j');
    press('ArrowDown');
    expect(highlighted()).toBe(2);
    press('j'); // stops at the last
    expect(highlighted()).toBe(2);
    press('k');
    expect(highlighted()).toBe(1);
    // Typing "jk" in the search field or a combobox: the page leaves the keys alone.
    expect(press('j', el('INPUT'))).toBe(false);
    expect(press('k', el('DIV', { role: 'combobox' }))).toBe(false);
    expect(highlighted()).toBe(1);
    // Exactly one row is marked at a time.
    expect(rows().filter((r) => holderOf(r).props['aria-current'] === 'true')).toHaveLength(1);
  });

  test('o (or Enter) opens the highlighted item: the review of an inspection, the page of a ride', async () => {
    const view = renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    press('j');
    press('j');
    press('o');
    expect(await screen.findByText('Page of one ride')).toBeTruthy();
    expect(view.getPathname()).toBe('/rides/ride-2');
  });

  test('Enter with nothing highlighted opens nothing; after j it opens the first inspection', async () => {
    const view = renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    expect(press('Enter')).toBe(true);
    expect(view.getPathname()).toBe('/review');
    press('j');
    press('Enter');
    expect(await screen.findByText('Review desk of one inspection')).toBeTruthy();
    expect(view.getPathname()).toBe('/review/insp-1');
  });

  test('the page’s inspections are remembered in order for j/k on an inspection (rides are skipped)', async () => {
    renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    expect(queueNeighbour('insp-1', 1)).toBe('insp-3');
    expect(queueNeighbour('insp-3', -1)).toBe('insp-1');
    expect(queueNeighbour('insp-3', 1)).toBeNull();
    expect(queueNeighbour('insp-9', 1)).toBeNull();
  });

  test('? and the "Keyboard shortcuts" button open the list of keys; ? closes it; keys wait meanwhile', async () => {
    renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    press('?');
    const list = await screen.findByLabelText('Keys on this page');
    for (const words of [
      'Highlight the next item',
      'Highlight the previous item',
      'Open the highlighted item',
    ])
      expect(within(list).getByText(words)).toBeTruthy();
    expect(within(list).getByText('j')).toBeTruthy();
    expect(within(list).getByText('Enter')).toBeTruthy();
    // While the list is open j moves nothing underneath it.
    press('j');
    expect(highlighted()).toBe(-1);
    press('?');
    expect(screen.queryByLabelText('Keys on this page')).toBeNull();
  });

  test('the keys can be turned off from the list (WCAG 2.1 SC 2.1.4) and on again', async () => {
    renderQueue();
    await screen.findByRole('link', { name: /Ride 3/ });
    fireEvent.press(screen.getByRole('button', { name: 'Keyboard shortcuts' }));
    const box = () => screen.getByRole('checkbox', { name: /^Use these keys/ });
    await screen.findByLabelText('Keys on this page');
    expect(box().props.accessibilityState?.checked).toBe(true);
    fireEvent.press(box());
    expect(box().props.accessibilityState?.checked).toBe(false);
    expect(press('?')).toBe(false); // ? no longer closes it either: the Close button or Escape does
    fireEvent.press(screen.getByRole('button', { name: 'Close' }));
    expect(press('j')).toBe(false);
    expect(highlighted()).toBe(-1);
    fireEvent.press(screen.getByRole('button', { name: 'Keyboard shortcuts' }));
    fireEvent.press(await screen.findByRole('checkbox', { name: /^Use these keys/ }));
    fireEvent.press(screen.getByRole('button', { name: 'Close' }));
    expect(press('j')).toBe(true);
    expect(highlighted()).toBe(0);
  });
});

describe('a phone (use-shortcuts.ts)', () => {
  test('has no shortcuts and no help button', () => {
    const native = jest.requireActual<typeof import('@/features/review/use-shortcuts')>(
      '@/features/review/use-shortcuts.ts',
    );
    expect(native.keyboardShortcuts).toBe(false);
    expect(native.useShortcutsOn()).toBe(false);
  });
});
