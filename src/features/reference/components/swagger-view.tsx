/** swagger-ui-react and its stylesheet: a chunk of their own, fetched only by the API reference page. */
import { useEffect, useRef } from 'react';
import SwaggerUI from 'swagger-ui-react';
import 'swagger-ui-react/swagger-ui.css';
import './swagger-theme.css';

/** Names for the pickers swagger-ui renders without a label (WCAG 4.1.2), by their class. */
const unlabelledSelects: Array<[string, string]> = [
  ['examples-select-element', 'Example'],
  ['content-type', 'Media type'],
];

/** Labels swagger-ui's unlabelled pickers and lets the keyboard reach its scrollable examples (WCAG 2.1.1). */
function repairAccessibility(root: HTMLElement) {
  for (const example of root.querySelectorAll<HTMLElement>('.highlight-code > .microlight:not([tabindex])')) {
    example.setAttribute('tabindex', '0');
    example.setAttribute('aria-label', 'Example');
  }
  for (const select of root.querySelectorAll<HTMLSelectElement>('select:not([aria-label]):not([aria-labelledby])')) {
    if (select.labels && select.labels.length > 0) continue;
    const name = unlabelledSelects.find(([cls]) => select.classList.contains(cls))?.[1] ?? 'Choose';
    select.setAttribute('aria-label', name);
  }
}

export default function SwaggerView({ url }: { url: string }) {
  const root = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const element = root.current;
    if (!element) return;
    repairAccessibility(element);
    // swagger-ui renders operations as they are opened: repair what appears.
    const observer = new MutationObserver(() => repairAccessibility(element));
    observer.observe(element, { childList: true, subtree: true });
    return () => observer.disconnect();
  }, []);
  return (
    <div ref={root}>
      <SwaggerUI url={url} docExpansion="list" defaultModelsExpandDepth={0} deepLinking={false} displayRequestDuration tryItOutEnabled={false} />
    </div>
  );
}
