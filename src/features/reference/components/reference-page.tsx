import { lazy, Suspense } from 'react';
import { PageHeader } from '../../../components/ui/feedback.tsx';
import { LoadingState } from '../../../components/ui/feedback.tsx';

const SwaggerView = lazy(() => import('./swagger-view.tsx'));

/** The OpenAPI document (served at /openapi.json), rendered. The renderer loads with this page only. */
export function ReferencePage() {
  return (
    <div>
      <PageHeader
        title="API reference"
        summary={
          <>
            Every endpoint, field and problem type, from the same schemas that validate the calls. The document itself is at{' '}
            <a href="/openapi.json" className="font-mono text-copper underline">
              /openapi.json
            </a>
            ; a typed TypeScript client generated from it ships with the repository (see the README).
          </>
        }
      />
      <div className="ohmstead-reference rounded-lg border border-line bg-white p-2 sm:p-4">
        <Suspense fallback={<LoadingState label="Loading the API reference…" />}>
          <SwaggerView url="/openapi.json" />
        </Suspense>
      </div>
    </div>
  );
}
