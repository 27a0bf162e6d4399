// A tiny element builder: the panels are plain DOM, no framework.

type Child = Node | string | number | null | undefined | false;

export interface ElementProps {
  class?: string;
  id?: string;
  title?: string;
  /** data-* attributes (without the prefix). */
  data?: Record<string, string>;
  /** Other attributes (never 'style': the page's CSP forbids inline styles). */
  attrs?: Record<string, string>;
  on?: Partial<{ [K in keyof HTMLElementEventMap]: (event: HTMLElementEventMap[K]) => void }>;
}

export function h<K extends keyof HTMLElementTagNameMap>(tag: K, props: ElementProps = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const element = document.createElement(tag);
  if (props.class) element.className = props.class;
  if (props.id) element.id = props.id;
  if (props.title) element.title = props.title;
  for (const [key, value] of Object.entries(props.data ?? {})) element.dataset[key] = value;
  for (const [key, value] of Object.entries(props.attrs ?? {})) element.setAttribute(key, value);
  for (const [type, listener] of Object.entries(props.on ?? {})) element.addEventListener(type, listener as EventListener);
  append(element, children);
  return element;
}

export function append(parent: Element, children: Child[]): void {
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    parent.append(typeof child === 'number' ? String(child) : child);
  }
}

/** Replace every child of `parent`. */
export function replaceChildren(parent: Element, ...children: Child[]): void {
  parent.replaceChildren();
  append(parent, children);
}

export function field(label: string, control: HTMLElement, hint?: string): HTMLLabelElement {
  return h('label', { class: 'field' }, h('span', { class: 'field-label' }, label), control, hint ? h('span', { class: 'field-hint' }, hint) : null);
}

export function button(label: string, onClick: () => void, props: ElementProps = {}): HTMLButtonElement {
  const b = h('button', { ...props, attrs: { type: 'button', ...(props.attrs ?? {}) } }, label);
  b.addEventListener('click', onClick);
  return b;
}

export function select(options: { value: string; label: string }[], value: string, onChange: (value: string) => void, props: ElementProps = {}): HTMLSelectElement {
  const s = h('select', props, ...options.map((o) => h('option', { attrs: { value: o.value } }, o.label)));
  s.value = value;
  s.addEventListener('change', () => onChange(s.value));
  return s;
}

export function textInput(value: string, props: ElementProps = {}): HTMLInputElement {
  const input = h('input', { ...props, attrs: { type: 'text', spellcheck: 'false', autocomplete: 'off', ...(props.attrs ?? {}) } });
  input.value = value;
  return input;
}

/** A card with a heading; `body` is filled by the panel. */
export function card(title: string, id: string, ...extra: Child[]): { root: HTMLElement; body: HTMLElement } {
  const body = h('div', { class: 'card-body' });
  const root = h('section', { class: 'card', id, attrs: { 'aria-labelledby': `${id}-title` } }, h('h2', { id: `${id}-title` }, title, ...extra), body);
  return { root, body };
}
