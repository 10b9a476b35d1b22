/**
 * How a chart is pointed at in a browser: a mouse or pen hovering moves the cursor and leaving the chart
 * hides it (a finger goes through the chart's responder, as on a phone); the chart has a tab stop and the
 * arrow keys step through its samples.
 */
export function hoverProps(pointAt: (px: number) => void, leave: () => void): object {
  return {
    onPointerMove: (e: PointerEvent & { currentTarget: Element }) => {
      if (e.pointerType === 'touch') return;
      pointAt(e.clientX - e.currentTarget.getBoundingClientRect().left);
    },
    onPointerLeave: (e: PointerEvent) => {
      if (e.pointerType !== 'touch') leave();
    },
  };
}

/** Added to a chart's accessible name: how to read its values. */
export const READ_HINT = ' Arrow keys read its values one sample at a time.';
