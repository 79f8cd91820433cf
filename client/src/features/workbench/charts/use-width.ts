import { useParentSize } from "@visx/responsive";

/**
 * The width of a chart's container, followed as the window or the side panel resizes (visx's ResizeObserver hook),
 * so charts draw at the width they are given: a 390 px phone gets a narrow chart, never a page that scrolls sideways.
 * The container must be allowed to shrink (`min-w-0` on grid and flex items above it).
 */
export function useWidth<T extends HTMLElement>() {
  const { parentRef, width } = useParentSize<T>({ debounceTime: 50, initialSize: { width: 0 } });
  // Before the first measurement the chart is drawn narrow rather than wider than a phone; 200 px keeps axes legible.
  return { ref: parentRef, width: Math.max(200, Math.floor(width)) };
}
