import { NavLink, Outlet } from 'react-router';
import { sections } from '../../app/sections.ts';

export function ConsoleLayout() {
  return (
    <div className="min-h-screen md:grid md:grid-cols-[15rem_1fr]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:m-2 focus:rounded focus:bg-paper focus:p-2">
        Skip to content
      </a>
      <aside className="border-b border-line bg-paper-deep md:min-h-screen md:border-b-0 md:border-r">
        <div className="flex items-center gap-2 px-5 py-5">
          <img src="/favicon.svg" alt="" className="h-7 w-7" />
          <span className="text-lg font-semibold tracking-tight">Ohmstead</span>
        </div>
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
      </aside>
      <main id="main" className="px-6 py-8 md:px-10">
        <Outlet />
      </main>
    </div>
  );
}
