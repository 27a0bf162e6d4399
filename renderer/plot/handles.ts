// Handles over the plot that move only when grabbed: the fit window's edges and the measurement cursors.

import { h } from '../dom';
import { fromPixel, toPixel, type AxisGeometry } from './plotly';

export interface HandleSpec {
  id: string;
  /** 'x': a vertical line at a time, across both panels; 'y': a horizontal line at a level of the main panel. */
  axis: 'x' | 'y';
  value: number;
  kind: 'window' | 'cursor';
  label: string;
  title: string;
}

/** The laid-out axes of the plot: time, and the main panel's values. */
export interface HandleGeometry {
  x: AxisGeometry;
  y: AxisGeometry;
  /** Pixels from the plot's top to the top of the main panel and to the bottom of the residual panel. */
  top: number;
  bottom: number;
}

/** A press that moves less than this is a click, not a drag: a window never moves by a twitch. */
const DRAG_THRESHOLD_PX = 3;
/** Half the width of a handle's grab zone, px: wide enough to catch, narrow enough to leave the plot to zooming. */
const GRAB_HALF_PX = 6;

interface Drag {
  id: string;
  pointer: number;
  startPixel: number;
  moved: boolean;
  value: number;
}

export class HandleLayer {
  private readonly elements = new Map<string, HTMLElement>();
  private specs = new Map<string, HandleSpec>();
  private geometry: HandleGeometry | null = null;
  private drag: Drag | null = null;

  /** `onMove` hears every move of a drag (`done` false) and its end (`done` true); a press without a drag is not heard. */
  constructor(
    readonly layer: HTMLElement,
    private readonly onMove: (id: string, value: number, done: boolean) => void,
  ) {}

  /** Show these handles (and no others) where their values lie; one outside the view is hidden. */
  place(specs: HandleSpec[], geometry: HandleGeometry | null): void {
    this.geometry = geometry;
    this.specs = new Map(specs.map((s) => [s.id, s]));
    for (const [id, element] of this.elements) {
      if (!this.specs.has(id)) {
        element.remove();
        this.elements.delete(id);
      }
    }
    for (const spec of specs) {
      const element = this.elements.get(spec.id) ?? this.create(spec);
      element.title = spec.title;
      (element.firstElementChild as HTMLElement).textContent = spec.label;
      if (this.drag?.id !== spec.id) this.position(element, spec.axis, spec.value);
    }
  }

  private create(spec: HandleSpec): HTMLElement {
    const element = h(
      'div',
      { class: `plot-handle plot-handle-${spec.axis} plot-handle-${spec.kind}`, data: { handle: spec.id }, attrs: { role: 'slider', 'aria-label': spec.title } },
      h('span', { class: 'plot-handle-tab' }),
      h('span', { class: 'plot-handle-line' }),
    );
    element.addEventListener('pointerdown', (event) => this.grab(event, spec.id));
    element.addEventListener('pointermove', (event) => this.follow(event));
    element.addEventListener('pointerup', (event) => this.release(event));
    element.addEventListener('pointercancel', () => this.cancel());
    // A double-click on a handle is not the plot's (which shows the whole capture).
    element.addEventListener('dblclick', (event) => event.stopPropagation());
    this.layer.append(element);
    this.elements.set(spec.id, element);
    return element;
  }

  private position(element: HTMLElement, axis: 'x' | 'y', value: number): void {
    const g = this.geometry;
    const shown = g !== null && Number.isFinite(value) && within(axis === 'x' ? g.x : g.y, value);
    element.hidden = !shown;
    element.dataset.value = String(value);
    if (!shown || !g) return;
    if (axis === 'x') {
      element.style.transform = `translate(${toPixel(g.x, value, false) - GRAB_HALF_PX}px, ${g.top}px)`;
      element.style.height = `${g.bottom - g.top}px`;
    } else {
      element.style.transform = `translate(${g.x.offset}px, ${toPixel(g.y, value, true) - GRAB_HALF_PX}px)`;
      element.style.width = `${g.x.length}px`;
    }
  }

  private pixelOf(event: PointerEvent, axis: 'x' | 'y'): number {
    const box = this.layer.getBoundingClientRect();
    return axis === 'x' ? event.clientX - box.left : event.clientY - box.top;
  }

  private grab(event: PointerEvent, id: string): void {
    const spec = this.specs.get(id);
    if (!spec || event.button !== 0) return;
    event.preventDefault();
    event.stopPropagation();
    (event.currentTarget as HTMLElement).setPointerCapture(event.pointerId);
    this.drag = { id, pointer: event.pointerId, startPixel: this.pixelOf(event, spec.axis), moved: false, value: spec.value };
    this.elements.get(id)?.classList.add('grabbed');
  }

  private follow(event: PointerEvent): void {
    const drag = this.drag;
    const spec = drag && this.specs.get(drag.id);
    const g = this.geometry;
    if (!drag || !spec || !g || event.pointerId !== drag.pointer) return;
    const axis = spec.axis === 'x' ? g.x : g.y;
    const pixel = Math.min(axis.offset + axis.length, Math.max(axis.offset, this.pixelOf(event, spec.axis)));
    if (!drag.moved && Math.abs(pixel - drag.startPixel) < DRAG_THRESHOLD_PX) return;
    drag.moved = true;
    drag.value = fromPixel(axis, pixel, spec.axis === 'y');
    const element = this.elements.get(drag.id);
    if (element) this.position(element, spec.axis, drag.value);
    this.onMove(drag.id, drag.value, false);
  }

  private release(event: PointerEvent): void {
    const drag = this.drag;
    if (!drag || event.pointerId !== drag.pointer) return;
    this.cancel();
    if (drag.moved) this.onMove(drag.id, drag.value, true);
  }

  private cancel(): void {
    if (this.drag) this.elements.get(this.drag.id)?.classList.remove('grabbed');
    this.drag = null;
  }
}

function within(axis: AxisGeometry, value: number): boolean {
  const [a, b] = axis.range;
  return value >= Math.min(a, b) && value <= Math.max(a, b);
}
