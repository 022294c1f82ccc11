import { NavLink, Route, Routes, useParams } from 'react-router';
import { PageHeader } from '../../../components/ui/feedback.tsx';
import { calculations } from '../calcs/index.ts';
import { CalculationPage } from './calculation-page.tsx';

function CalculationList() {
  return (
    <div>
      <PageHeader
        title="Playground"
        summary="Try every calculation with a form, read the result, and copy the same request as code. Each run is a real call under one of your server keys, so it shows in Usage."
      />
      <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
        {calculations.map((c) => (
          <li key={c.slug}>
            <NavLink to={c.slug} className="block h-full rounded-lg border border-line bg-white/70 p-4 hover:border-copper">
              <span className="font-semibold text-copper">{c.title}</span>
              <span className="mt-1 block text-sm text-graphite-soft">{c.summary}</span>
              <span className="mt-2 block font-mono text-xs text-graphite-soft">POST {c.endpoint}</span>
            </NavLink>
          </li>
        ))}
      </ul>
    </div>
  );
}

function Calculation() {
  const { slug } = useParams();
  const definition = calculations.find((c) => c.slug === slug);
  if (!definition) {
    return (
      <div>
        <PageHeader title="No such calculation" summary="Choose one from the list." />
      </div>
    );
  }
  // A fresh form per calculation.
  return <CalculationPage key={definition.slug} definition={definition} />;
}

/** /playground and /playground/<calculation>. */
export function PlaygroundPage() {
  return (
    <div className="lg:grid lg:grid-cols-[13rem_minmax(0,1fr)] lg:gap-8">
      <nav aria-label="Calculations" className="mb-6 lg:mb-0">
        <p className="mb-2 text-xs font-semibold uppercase tracking-wide text-graphite-soft">Calculations</p>
        <ul className="flex flex-wrap gap-1 lg:flex-col">
          {calculations.map((c) => (
            <li key={c.slug}>
              <NavLink
                to={`/playground/${c.slug}`}
                className={({ isActive }) =>
                  `block rounded-md px-3 py-1.5 text-sm ${isActive ? 'bg-copper-wash font-medium text-[#8f4b1c]' : 'text-graphite-soft hover:bg-paper-deep hover:text-graphite'}`
                }
              >
                {c.title}
              </NavLink>
            </li>
          ))}
        </ul>
      </nav>
      <div className="min-w-0">
        <Routes>
          <Route index element={<CalculationList />} />
          <Route path=":slug" element={<Calculation />} />
        </Routes>
      </div>
    </div>
  );
}
