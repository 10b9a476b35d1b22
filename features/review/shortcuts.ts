/**
 * The review desk's keyboard shortcuts: which key does what, on which page, and when a key is left alone.
 * Pure (no React, no DOM types beyond the few fields read), so the rules are tested without a browser;
 * `use-shortcuts.web.ts` listens for the keys, `shortcut-help.tsx` lists them.
 *
 * Single letters without modifiers, as mail and code-review desks commonly use them (j/k down/up, o open,
 * ? help): they never fire while the person types (an input, a text area, a select, a combobox or an
 * editable element has focus), and never with Ctrl, Alt or Meta, so the browser's own keys stay theirs.
 */

export type ShortcutAction = 'next' | 'previous' | 'open' | 'approve' | 'return' | 'help';

/** The help overlay's name (its dialog's label and the button that opens it). */
export const shortcutHelpTitle = 'Keyboard shortcuts';

/** Where the keys are read: the queue's list, or one inspection reached from it. */
export type ShortcutPage = 'queue' | 'inspection';

type KeyRow = { keys: readonly string[]; action: ShortcutAction; words: string };

/** Each page's keys, in the order the help lists them; the first key of a row is the one shown first. */
export const shortcutKeys: Record<ShortcutPage, readonly KeyRow[]> = {
  queue: [
    { keys: ['j', 'ArrowDown'], action: 'next', words: 'Highlight the next item' },
    { keys: ['k', 'ArrowUp'], action: 'previous', words: 'Highlight the previous item' },
    { keys: ['Enter', 'o'], action: 'open', words: 'Open the highlighted item' },
    { keys: ['?'], action: 'help', words: 'Show or hide these shortcuts' },
  ],
  inspection: [
    { keys: ['j'], action: 'next', words: 'Next inspection in the queue' },
    { keys: ['k'], action: 'previous', words: 'Previous inspection in the queue' },
    {
      keys: ['a'],
      action: 'approve',
      words: 'Start an approval: goes to the decision, which you still confirm with its button',
    },
    {
      keys: ['r'],
      action: 'return',
      words: 'Start a return: goes to the comment the inspector must be given, then the button',
    },
    { keys: ['?'], action: 'help', words: 'Show or hide these shortcuts' },
  ],
};

/** How a key is written in the help: arrows as arrows, letters as typed. */
export function keyWords(key: string): string {
  return ({ ArrowDown: '↓', ArrowUp: '↑', Enter: 'Enter' } as Record<string, string>)[key] ?? key;
}

/** The fields of a keyboard event (DOM `KeyboardEvent`) the rules read. */
export type KeyPress = {
  key: string;
  ctrlKey?: boolean;
  altKey?: boolean;
  metaKey?: boolean;
  defaultPrevented?: boolean;
  target?: unknown;
};

/** What the rules read of the element the key went to (a DOM `Element`). */
type TargetLike = {
  tagName?: string;
  isContentEditable?: boolean;
  getAttribute?: (name: string) => string | null;
};

const typingTags = new Set(['INPUT', 'TEXTAREA', 'SELECT']);
const typingRoles = new Set(['combobox', 'textbox', 'searchbox', 'spinbutton', 'listbox', 'slider']);
/** Elements whose own Enter key (following a link, pressing a button) must keep working. */
const pressableTags = new Set(['A', 'BUTTON']);
const pressableRoles = new Set([
  'link',
  'button',
  'checkbox',
  'radio',
  'tab',
  'menuitem',
  'switch',
  'option',
]);

const asTarget = (t: unknown): TargetLike | null => (t && typeof t === 'object' ? (t as TargetLike) : null);
const roleOf = (t: TargetLike) => t.getAttribute?.('role') ?? null;

/** True while the key goes to something a person types into: the shortcuts leave it alone. */
export function isTypingTarget(target: unknown): boolean {
  const t = asTarget(target);
  if (!t) return false;
  if (t.isContentEditable) return true;
  if (t.tagName && typingTags.has(t.tagName.toUpperCase())) return true;
  const role = roleOf(t);
  return role !== null && typingRoles.has(role);
}

function isPressable(target: unknown): boolean {
  const t = asTarget(target);
  if (!t) return false;
  if (t.tagName && pressableTags.has(t.tagName.toUpperCase())) return true;
  const role = roleOf(t);
  return role !== null && pressableRoles.has(role);
}

/**
 * The action a key press asks for on `page`, or null when the key is not a shortcut there or must be left
 * to what has focus: typing, a modifier held, a press already handled, or Enter on a link or button (which
 * follows or presses it, as it would without the shortcuts).
 */
export function shortcutFor(press: KeyPress, page: ShortcutPage): ShortcutAction | null {
  if (press.defaultPrevented || press.ctrlKey || press.altKey || press.metaKey) return null;
  if (isTypingTarget(press.target)) return null;
  if (press.key === 'Enter' && isPressable(press.target)) return null;
  return shortcutKeys[page].find((row) => row.keys.includes(press.key))?.action ?? null;
}

/** The place one step from `index` in a list of `length` items (none highlighted yet: the first). */
export function stepIndex(index: number, length: number, step: 1 | -1): number {
  if (length === 0) return -1;
  if (index < 0 || index >= length) return 0;
  return Math.min(length - 1, Math.max(0, index + step));
}
