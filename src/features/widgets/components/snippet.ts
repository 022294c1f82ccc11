/** The snippet a site owner copies: the script once, then the widget's tag with its options (pure). */
import type { WidgetTag } from '#shared/schemas/widgets.ts';

/** The bundle's major version: the moving alias the snippet loads (widgets/version.ts WIDGETS_MAJOR). */
export const WIDGETS_MAJOR_PATH = '1';

export interface WidgetOptions {
  tag: WidgetTag;
  key: string;
  units: 'metric' | 'imperial';
  theme: 'light' | 'dark' | 'auto';
  catalog: 'organization' | 'none';
  hostSku: string;
  packSku: string;
}

export const widgetLabels: Record<WidgetTag, string> = {
  'ohmstead-compatibility': 'Compatibility checker',
  'ohmstead-pack-value': 'Pack-value comparison',
  'ohmstead-wire-fuse': 'Wire-and-fuse sizer',
  'ohmstead-charge-time': 'Charge-time estimator',
};

/** Which options a widget reads. */
export const widgetUses: Record<WidgetTag, { catalog: boolean; hostSku: boolean; packSku: boolean }> = {
  'ohmstead-compatibility': { catalog: true, hostSku: true, packSku: true },
  'ohmstead-pack-value': { catalog: true, hostSku: false, packSku: false },
  'ohmstead-wire-fuse': { catalog: false, hostSku: false, packSku: false },
  'ohmstead-charge-time': { catalog: true, hostSku: false, packSku: true },
};

/** The element's attributes, defaults left out. */
export function widgetAttributes(o: WidgetOptions): Array<[string, string]> {
  const uses = widgetUses[o.tag];
  const attrs: Array<[string, string]> = [['key', o.key]];
  if (o.units !== 'metric') attrs.push(['units', o.units]);
  if (o.theme !== 'light') attrs.push(['theme', o.theme]);
  if (uses.catalog && o.catalog === 'none') attrs.push(['catalog', 'none']);
  if (uses.hostSku && o.hostSku && o.catalog !== 'none') attrs.push(['host-sku', o.hostSku]);
  if (uses.packSku && o.packSku && o.catalog !== 'none') attrs.push(['pack-sku', o.packSku]);
  return attrs;
}

const escapeAttr = (s: string) => s.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');

export function snippet(o: WidgetOptions, apiOrigin: string): string {
  const attrs = widgetAttributes(o).map(([k, v]) => ` ${k}="${escapeAttr(v)}"`).join('');
  return [
    `<script type="module" src="${apiOrigin}/widgets/${WIDGETS_MAJOR_PATH}/ohmstead-widgets.js"></script>`,
    `<${o.tag}${attrs}></${o.tag}>`,
  ].join('\n');
}
