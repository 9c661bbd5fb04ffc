import { NavLink, Outlet } from 'react-router-dom';

const NAV = [{ to: '/', label: 'Overview', end: true }];

export function AppLayout() {
  return (
    <div className="min-h-screen font-sans">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-tide-900 text-white">
        <div className="mx-auto flex max-w-6xl items-center gap-6 px-4 py-3">
          <span className="text-xl font-bold tracking-tight">Planktide</span>
          <nav aria-label="Main">
            <ul className="flex gap-4">
              {NAV.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.end}
                    className={({ isActive }) => (isActive ? 'font-semibold underline underline-offset-4' : 'opacity-90 hover:opacity-100')}
                  >
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
