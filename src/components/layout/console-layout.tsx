import type { ReactNode } from 'react';
import { NavLink, Outlet } from 'react-router';
import type { Section } from '../../app/sections.ts';

/**
 * The signed-in frame: the name, the organization switcher, the sections the role may see, the person's
 * menu, then the page. The parts that need the session are passed in by the app.
 */
export function ConsoleLayout({ sections, organization, account }: { sections: Section[]; organization?: ReactNode; account?: ReactNode }) {
  return (
    <div className="min-h-screen md:grid md:grid-cols-[15rem_1fr]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:m-2 focus:rounded focus:bg-paper focus:p-2">
        Skip to content
      </a>
      <aside className="flex flex-col border-b border-line bg-paper-deep md:min-h-screen md:border-b-0 md:border-r">
        <div className="flex items-center gap-2 px-5 py-5">
          <img src="/favicon.svg" alt="" className="h-7 w-7" />
          <span className="text-lg font-semibold tracking-tight">Ohmstead</span>
        </div>
        {organization}
        <nav aria-label="Console sections" className="px-3 pb-4">
          <ul className="flex flex-wrap gap-1 md:flex-col">
            {sections.map((s) => (
              <li key={s.path}>
                <NavLink
                  to={s.path}
                  end={s.path === '/'}
                  className={({ isActive }) =>
                    `block rounded-md px-3 py-2 text-sm ${
                      isActive ? 'bg-copper-wash font-medium text-copper' : 'text-graphite-soft hover:bg-paper hover:text-graphite'
                    }`
                  }
                >
                  {s.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <div className="mt-auto border-t border-line px-5 py-4">{account}</div>
      </aside>
      <main id="main" className="px-6 py-8 md:px-10">
        <Outlet />
      </main>
    </div>
  );
}
