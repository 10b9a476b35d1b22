/**
 * A phone has no Escape key and no keyboard focus to place: an inline confirmation is left with its
 * Cancel button (or the back gesture, which leaves the page). `dialog-keys.web.ts` does both on the web.
 */
export function useEscapeKey(_active: boolean, _onEscape: () => void): void {}

export function focusFirstButton(_node: unknown): void {}
