// Mouse, pen and touch on the traces and the ruler:
//   wheel over traces → zoom around the pointer (pinch too); Shift+wheel or sideways → pan;
//   drag on traces → pan; click on a trace → active cursor there, snapped to a near edge;
//   drag a cursor line or flag → move it (snapping); drag on the ruler → zoom to that range.

import type { ViewState } from './state';

const SNAP_PX = 8;
const GRAB_PX = 5;
const CLICK_SLOP = 4;

export interface PointerHooks {
  /** Snapped tick for a pointer at canvas x over the lane at lane-area y (no snap when off). */
  snapAt(x: number, laneY: number | null): { tick: number; snapped: boolean };
  setRangeDrag(range: [number, number] | null): void;
  setSnapHint(tick: number | null): void;
  /** Row key under lane-area y. */
  rowAt(laneY: number): string | null;
}

export { SNAP_PX };

export function installPointer(state: ViewState, lanes: HTMLElement, ruler: HTMLElement, hooks: PointerHooks): void {
  const xOf = (e: { clientX: number }) => e.clientX - lanes.getBoundingClientRect().left;
  const laneYOf = (e: { clientY: number }) => e.clientY - lanes.getBoundingClientRect().top + lanes.scrollTop;
  const cursorNear = (x: number): number => {
    let best = -1;
    let bestD = GRAB_PX + 1;
    state.cursors.forEach((c, i) => {
      const d = Math.abs((c.tick - state.t0) / state.tpp - x);
      if (d < bestD || (d === bestD && i === state.active)) {
        best = i;
        bestD = d;
      }
    });
    return bestD <= GRAB_PX ? best : -1;
  };

  lanes.addEventListener(
    'wheel',
    (e) => {
      if ((e.target as HTMLElement).closest('.cap')) return; // over a caption: scroll the lanes
      e.preventDefault();
      const unit = e.deltaMode === 1 ? 16 : e.deltaMode === 2 ? lanes.clientHeight : 1;
      const dx = e.deltaX * unit;
      const dy = e.deltaY * unit;
      if (e.shiftKey && !e.ctrlKey) state.panBy(dy || dx);
      else if (Math.abs(dx) > Math.abs(dy)) state.panBy(dx);
      else state.zoomAt(xOf(e), Math.exp(-dy * (e.ctrlKey ? 0.01 : 0.0025)));
    },
    { passive: false },
  );

  let mode: 'none' | 'pending' | 'pan' | 'cursor' | 'pinch' = 'none';
  let startX = 0;
  let lastX = 0;
  let dragging = -1;
  // Two fingers on a touch screen: pinch to zoom around their midpoint, move together to pan.
  const touches = new Map<number, number>();
  let pinchGap = 0;
  let pinchMid = 0;
  const pinchNow = () => {
    const [a, b] = [...touches.values()];
    return { gap: Math.max(1, Math.abs(a - b)), mid: (a + b) / 2 };
  };

  lanes.addEventListener('pointerdown', (e) => {
    if (e.button !== 0 || (e.target as HTMLElement).closest('.cap')) return;
    const x = xOf(e);
    if (e.pointerType === 'touch') {
      touches.set(e.pointerId, x);
      if (touches.size === 2) {
        mode = 'pinch';
        ({ gap: pinchGap, mid: pinchMid } = pinchNow());
        lanes.setPointerCapture(e.pointerId);
        return;
      }
    }
    startX = lastX = x;
    dragging = cursorNear(x);
    mode = dragging >= 0 ? 'cursor' : 'pending';
    if (dragging >= 0) state.setActive(dragging);
    lanes.setPointerCapture(e.pointerId);
    lanes.focus({ preventScroll: true });
  });

  lanes.addEventListener('pointermove', (e) => {
    const x = xOf(e);
    if (touches.has(e.pointerId)) touches.set(e.pointerId, x);
    if (mode === 'pinch') {
      if (touches.size < 2) return;
      const { gap, mid } = pinchNow();
      state.batch(() => {
        state.panBy(pinchMid - mid);
        state.zoomAt(mid, gap / pinchGap);
      });
      pinchGap = gap;
      pinchMid = mid;
      return;
    }
    if (mode === 'none') {
      if ((e.target as HTMLElement).closest('.cap')) {
        hooks.setSnapHint(null);
        return;
      }
      lanes.classList.toggle('is-over-cursor', cursorNear(x) >= 0);
      const s = hooks.snapAt(x, laneYOf(e));
      hooks.setSnapHint(s.snapped ? s.tick : null);
      return;
    }
    if (mode === 'cursor') {
      state.moveCursor(dragging, hooks.snapAt(x, laneYOf(e)).tick);
      return;
    }
    if (mode === 'pending' && Math.abs(x - startX) > CLICK_SLOP) {
      mode = 'pan';
      lanes.classList.add('is-panning');
    }
    if (mode === 'pan') {
      state.panBy(lastX - x);
      lastX = x;
    }
  });

  const end = (e: PointerEvent) => {
    touches.delete(e.pointerId);
    if (mode === 'pinch') {
      if (touches.size < 2) mode = 'none';
      if (lanes.hasPointerCapture(e.pointerId)) lanes.releasePointerCapture(e.pointerId);
      return;
    }
    if (mode === 'pending' && e.type === 'pointerup') {
      const y = laneYOf(e);
      const key = hooks.rowAt(y);
      state.batch(() => {
        if (key) state.select(key, 'only');
        state.moveCursor(state.active, hooks.snapAt(xOf(e), y).tick);
      });
    }
    mode = 'none';
    dragging = -1;
    lanes.classList.remove('is-panning');
    if (lanes.hasPointerCapture(e.pointerId)) lanes.releasePointerCapture(e.pointerId);
  };
  lanes.addEventListener('pointerup', end);
  lanes.addEventListener('pointercancel', end);
  lanes.addEventListener('pointerleave', () => {
    if (mode === 'none') hooks.setSnapHint(null);
  });

  // ---- ruler ----
  let rulerMode: 'none' | 'range' | 'cursor' = 'none';
  let rulerStart = 0;
  ruler.addEventListener('pointerdown', (e) => {
    if (e.button !== 0) return;
    const x = xOf(e);
    rulerStart = x;
    dragging = cursorNear(x);
    rulerMode = dragging >= 0 ? 'cursor' : 'range';
    if (dragging >= 0) state.setActive(dragging);
    ruler.setPointerCapture(e.pointerId);
  });
  ruler.addEventListener('pointermove', (e) => {
    const x = xOf(e);
    if (rulerMode === 'none') {
      ruler.classList.toggle('is-over-cursor', cursorNear(x) >= 0);
      return;
    }
    if (rulerMode === 'cursor') state.moveCursor(dragging, state.t0 + x * state.tpp);
    else if (Math.abs(x - rulerStart) > 2) hooks.setRangeDrag([rulerStart, x]);
  });
  const rulerEnd = (e: PointerEvent) => {
    const x = xOf(e);
    if (rulerMode === 'range' && e.type === 'pointerup') {
      hooks.setRangeDrag(null);
      if (Math.abs(x - rulerStart) > 3) {
        const a = state.t0 + Math.min(x, rulerStart) * state.tpp;
        const b = state.t0 + Math.max(x, rulerStart) * state.tpp;
        state.setWindow(a, b);
      } else state.moveCursor(state.active, state.t0 + x * state.tpp);
    } else hooks.setRangeDrag(null);
    rulerMode = 'none';
    dragging = -1;
    if (ruler.hasPointerCapture(e.pointerId)) ruler.releasePointerCapture(e.pointerId);
  };
  ruler.addEventListener('pointerup', rulerEnd);
  ruler.addEventListener('pointercancel', rulerEnd);
  ruler.addEventListener(
    'wheel',
    (e) => {
      e.preventDefault();
      state.zoomAt(xOf(e), Math.exp(-e.deltaY * 0.0025));
    },
    { passive: false },
  );
}
