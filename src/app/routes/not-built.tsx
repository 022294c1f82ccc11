import { useLocation } from 'react-router';
import { sections } from '../sections.ts';

/** An honest placeholder for a section whose work has not landed yet. */
export function NotBuiltYet() {
  const { pathname } = useLocation();
  const section = sections.find((s) => s.path === pathname) ?? sections[0]!;
  return (
    <section aria-labelledby="section-title" className="max-w-2xl">
      <h1 id="section-title" className="text-2xl font-semibold tracking-tight">
        {section.label}
      </h1>
      <p className="mt-2 text-graphite-soft">{section.summary}</p>
      <div className="mt-6 rounded-lg border border-dashed border-line bg-paper-deep p-5">
        <p className="font-medium">Not built yet.</p>
        <p className="mt-1 text-sm text-graphite-soft">
          This part of the console is planned but not available in this version. The API document is already at{' '}
          <a className="text-copper underline" href="/openapi.json">
            /openapi.json
          </a>
          .
        </p>
      </div>
    </section>
  );
}
