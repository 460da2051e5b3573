import { useEffect, useState } from 'react'
import { NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom'
import type { SessionUser } from '@shared/schemas/auth'
import { ROLE_LABELS } from '@shared/permissions'
import { Brand } from '@/components/layout/brand'
import { Button } from '@/components/ui/button'
import { navFor, paths } from '@/config/paths'
import type { NavItem } from '@/config/paths'
import { useLogout } from '@/features/auth/api/session'
import { cn } from '@/lib/cn'

function navClass({ isActive }: { isActive: boolean }) {
  return cn(
    'block rounded-md px-3 py-2 text-sm font-medium no-underline',
    isActive ? 'bg-olive-100 text-olive-900' : 'text-ink-700 hover:bg-cream-200 hover:text-ink-900',
  )
}

/** Items in their sidebar sections, in the order the sections first appear. */
function grouped(items: NavItem[]) {
  const groups: { name: string | null; items: NavItem[] }[] = []
  for (const item of items) {
    const name = item.group ?? null
    const g = groups.find((x) => x.name === name)
    if (g) g.items.push(item)
    else groups.push({ name, items: [item] })
  }
  return groups
}

function NavList({ items, onNavigate }: { items: NavItem[]; onNavigate?: () => void }) {
  return (
    <div className="flex flex-col gap-4">
      {grouped(items).map((g) => (
        <div key={g.name ?? 'main'}>
          {g.name ? (
            <p className="mb-1 px-3 text-xs font-medium uppercase tracking-wide text-ink-600">{g.name}</p>
          ) : null}
          <ul className="flex flex-col gap-0.5" onClick={onNavigate}>
            {g.items.map((i) => (
              <li key={i.to}>
                <NavLink to={i.to} end={i.end} className={navClass}>
                  {i.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </div>
      ))}
    </div>
  )
}

/** The signed-in frame: the mark, the role's own navigation in a sidebar, the person and sign-out. */
export function AppShell({ user }: { user: SessionUser }) {
  const [open, setOpen] = useState(false)
  const logout = useLogout()
  const navigate = useNavigate()
  const location = useLocation()
  const items = navFor[user.role]
  useEffect(() => setOpen(false), [location.pathname])

  const signOut = async () => {
    await logout.mutateAsync().catch(() => {})
    navigate(paths.signIn, { replace: true })
  }

  return (
    <div className="flex min-h-dvh flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2"
      >
        Skip to content
      </a>
      <header className="no-print sticky top-0 z-20 border-b border-cream-300 bg-white">
        <div className="flex items-center gap-4 px-4 py-3">
          <NavLink
            to={items[0]?.to ?? paths.root}
            className="rounded no-underline"
            aria-label="Lathercase home"
          >
            <Brand />
          </NavLink>
          <div className="ml-auto hidden items-center gap-3 lg:flex">
            <NavLink
              to={paths.account}
              className="rounded text-right text-sm leading-tight text-ink-700 no-underline hover:text-ink-900"
            >
              <span className="block font-medium text-ink-900">{user.name}</span>
              <span className="block text-xs">{ROLE_LABELS[user.role]}</span>
            </NavLink>
            <Button variant="secondary" size="sm" onClick={signOut} loading={logout.isPending}>
              Sign out
            </Button>
          </div>
          <button
            type="button"
            className="ml-auto rounded-md p-2 text-ink-800 hover:bg-cream-200 lg:hidden"
            aria-expanded={open}
            aria-controls="mobile-nav"
            onClick={() => setOpen((o) => !o)}
          >
            <span className="sr-only">Menu</span>
            <svg aria-hidden="true" viewBox="0 0 20 20" className="size-6 fill-current">
              <path d="M3 5h14v2H3zM3 9h14v2H3zM3 13h14v2H3z" />
            </svg>
          </button>
        </div>
        {open ? (
          <nav
            id="mobile-nav"
            aria-label="Main"
            className="max-h-[75dvh] overflow-y-auto border-t border-cream-300 px-4 py-3 lg:hidden"
          >
            <NavList
              items={[...items, { to: paths.account, label: `Account (${user.name})` }]}
              onNavigate={() => setOpen(false)}
            />
            <Button variant="secondary" size="sm" className="mt-3 w-full" onClick={signOut}>
              Sign out
            </Button>
          </nav>
        ) : null}
      </header>
      <div className="flex flex-1">
        <nav
          aria-label="Main"
          className="no-print hidden w-56 shrink-0 border-r border-cream-300 bg-cream-50 px-3 py-6 lg:block"
        >
          <NavList items={items} />
        </nav>
        <div className="flex min-w-0 flex-1 flex-col">
          <main id="main" tabIndex={-1} className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 sm:px-6 sm:py-8">
            <Outlet />
          </main>
          <footer className="no-print border-t border-cream-300 py-4 text-center text-xs text-ink-600">
            Lathercase · wholesale orders for handmade soap
          </footer>
        </div>
      </div>
    </div>
  )
}
