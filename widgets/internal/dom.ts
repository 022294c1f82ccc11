/**
 * Building DOM without HTML strings: no innerHTML, no inline handlers, no eval, so the widgets run under a
 * strict Content-Security-Policy (including `require-trusted-types-for 'script'`).
 */
type Child = Node | string | number | null | undefined | false;
type Attrs = Record<string, string | number | boolean | null | undefined>;

/** An element with attributes (false/null/undefined left out, true as an empty attribute) and children. */
export function h<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Attrs = {}, ...children: Array<Child | Child[]>): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  for (const [name, value] of Object.entries(attrs)) {
    if (value === false || value === null || value === undefined) continue;
    el.setAttribute(name, value === true ? '' : String(value));
  }
  append(el, children);
  return el;
}

const SVG_NS = 'http://www.w3.org/2000/svg';
/** An SVG element (namespaced), for the small charts. */
export function svg(tag: string, attrs: Attrs = {}, ...children: Node[]): SVGElement {
  const el = document.createElementNS(SVG_NS, tag);
  for (const [name, value] of Object.entries(attrs)) if (value !== undefined && value !== null && value !== false) el.setAttribute(name, String(value));
  for (const c of children) el.appendChild(c);
  return el;
}

export function append(parent: Node, children: Array<Child | Child[]>): void {
  for (const child of children.flat()) {
    if (child === null || child === undefined || child === false) continue;
    parent.appendChild(typeof child === 'object' ? child : document.createTextNode(String(child)));
  }
}

/** Replaces an element's children. */
export function replace(parent: ParentNode, ...children: Array<Child | Child[]>): void {
  parent.replaceChildren();
  append(parent, children);
}
