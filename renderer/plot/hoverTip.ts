// The bench's own hover readout: the time under the pointer and each curve's value there, in engineering notation.

import { h, replaceChildren } from '../dom';
import { formatEngineering } from '../../core/units/format';
import type { PlotlyHover } from './plotly';

/** Digits of a hovered value: as many as a pixel resolves on a wide plot. */
const DIGITS = 4;
/** Distance from the pointer to the readout's corner, px. */
const OFFSET_PX = 14;
/** The curves in the order a reader compares them: the samples first, what explains them after; others last. */
const ORDER = ['Measured', 'Fit', 'Residual', 'Design prediction'];
const rank = (name: string) => (ORDER.includes(name) ? ORDER.indexOf(name) : ORDER.length);

export class HoverTip {
  readonly element = h('div', { class: 'plot-tip', id: 'plot-tip', attrs: { role: 'status' } });

  constructor(private readonly frame: HTMLElement) {
    this.element.hidden = true;
  }

  /** Show the hovered points beside the pointer, flipped to stay inside the plot. */
  show(hover: PlotlyHover, unit: string): void {
    const points = hover.points.filter((p) => p.data.name && Number.isFinite(p.y)).sort((a, b) => rank(a.data.name ?? '') - rank(b.data.name ?? ''));
    if (points.length === 0) return this.hide();
    replaceChildren(
      this.element,
      h('div', { class: 'plot-tip-time' }, `t = ${formatEngineering(points[0].x, 's', DIGITS + 1)}`),
      ...points.map((p) =>
        h('div', { class: 'plot-tip-row' }, h('span', { class: 'plot-tip-name' }, p.data.name ?? ''), h('span', { class: 'plot-tip-value' }, formatEngineering(p.y, unit, DIGITS))),
      ),
    );
    this.element.hidden = false;
    const box = this.frame.getBoundingClientRect();
    const x = hover.event.clientX - box.left;
    const y = hover.event.clientY - box.top;
    const { offsetWidth: width, offsetHeight: height } = this.element;
    const left = x + OFFSET_PX + width > box.width ? x - OFFSET_PX - width : x + OFFSET_PX;
    const top = y + OFFSET_PX + height > box.height ? y - OFFSET_PX - height : y + OFFSET_PX;
    this.element.style.transform = `translate(${Math.max(0, left)}px, ${Math.max(0, top)}px)`;
  }

  hide(): void {
    this.element.hidden = true;
  }
}
