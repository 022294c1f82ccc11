import { describe, expect, it } from 'vitest';
import { WIDGETS_MAJOR } from '../../../../widgets/version.ts';
import { snippet, WIDGETS_MAJOR_PATH, type WidgetOptions } from './snippet.ts';

const base: WidgetOptions = { tag: 'ohmstead-compatibility', key: 'ohs_emb_abc', units: 'metric', theme: 'light', catalog: 'organization', hostSku: '', packSku: 'P-1' };

describe('the widget snippet', () => {
  it('when built, then it loads the bundle\'s current major alias once and carries only non-default options', () => {
    expect(WIDGETS_MAJOR_PATH).toBe(WIDGETS_MAJOR);
    expect(snippet(base, 'https://api.example')).toBe(
      '<script type="module" src="https://api.example/widgets/1/ohmstead-widgets.js"></script>\n<ohmstead-compatibility key="ohs_emb_abc" pack-sku="P-1"></ohmstead-compatibility>',
    );
  });

  it('when options do not apply to the widget, then they are left out; values are escaped', () => {
    const wire = snippet({ ...base, tag: 'ohmstead-wire-fuse', units: 'imperial', theme: 'dark', catalog: 'none' }, 'https://api.example');
    expect(wire.split('\n')[1]).toBe('<ohmstead-wire-fuse key="ohs_emb_abc" units="imperial" theme="dark"></ohmstead-wire-fuse>');
    expect(snippet({ ...base, packSku: 'A"<b' }, 'x')).toContain('pack-sku="A&quot;&lt;b"');
  });
});
