/**
 * How a chart is pointed at, per platform (the web's is chart-pointer.web.ts). On a phone a finger goes
 * through the chart's responder (a tap or a drag), so there is no hover and nothing more to say.
 */
export function hoverProps(_pointAt: (px: number) => void, _leave: () => void): object {
  return {};
}

/** Added to a chart's accessible name: how to read its values. */
export const READ_HINT = '';
