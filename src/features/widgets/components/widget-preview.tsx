import { useEffect, useRef } from 'react';
import { WIDGETS_MAJOR_PATH, widgetAttributes, type WidgetOptions } from './snippet.ts';

const BUNDLE = `/widgets/${WIDGETS_MAJOR_PATH}/ohmstead-widgets.js`;

/** Loads the real widget bundle from this server once (loading it twice would be harmless too). */
function loadBundle(): void {
  if (document.querySelector(`script[data-ohmstead-bundle]`)) return;
  const script = document.createElement('script');
  script.type = 'module';
  script.src = BUNDLE;
  script.dataset.ohmsteadBundle = '';
  document.head.append(script);
}

/**
 * The widget as a page would show it: the real bundle, the element created with the chosen attributes
 * (made by hand: React reserves the `key` prop the element needs as an attribute).
 */
export function WidgetPreview({ options, refresh }: { options: WidgetOptions; /** Changes when the key's sites change: the widget is made anew. */ refresh: string }) {
  const host = useRef<HTMLDivElement>(null);
  useEffect(() => {
    loadBundle();
    const el = document.createElement(options.tag);
    for (const [name, value] of widgetAttributes(options)) el.setAttribute(name, value);
    host.current?.replaceChildren(el);
  }, [options, refresh]);
  return <div ref={host} className="rounded-lg border border-dashed border-line bg-white p-3" />;
}
