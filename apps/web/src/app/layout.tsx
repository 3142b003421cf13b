import { Suspense } from 'react';
import { Navigate, NavLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { hasRole, roleLabels, ROLES, type Role } from '@splitscope/contract';
import { useMe } from '@/lib/api/me';
import { useSignOut } from '@/features/auth/api/sign-in';

/** A link's shorter words below 1280 px, so the admin's row of links fits at 1024 px. */
const Short = ({ short, long }: { short: string; long: string }) => (
  <>
    <span className="xl:hidden">{short}</span>
    <span className="hidden xl:inline">{long}</span>
  </>
);

/** The main links in their order; `roles` keeps a link to those roles (the contract's role sets). */
const LINKS: { to: string; label: string; short?: string; end?: boolean; roles?: readonly Role[] }[] = [
  { to: '/', label: 'Home', end: true },
  { to: '/jobs', label: 'Jobs', end: true },
  { to: '/customers', label: 'Customers' },
  { to: '/review', label: 'Review', roles: ROLES.reviewers },
  { to: '/boards', label: 'Board library', short: 'Boards', roles: ROLES.reviewers },
  { to: '/references', label: 'Bench references', short: 'References' },
  { to: '/people', label: 'People', roles: ROLES.admins },
  { to: '/shop', label: 'Shop', roles: ROLES.admins },
  { to: '/billing/settings', label: 'Billing', roles: ROLES.admins },
  { to: '/dev/mail', label: 'Mail outbox', short: 'Mail', roles: ROLES.admins },
];

/** The signed-in frame: header with navigation; sends signed-out visitors to the sign-in page. */
export function AppLayout() {
  const me = useMe();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const location = useLocation();
  if (me.isPending) return <p className="p-6">Loading…</p>;
  if (me.isError) return <p className="p-6 text-high">Could not reach the server: {me.error.message}</p>;
  if (!me.data) return <Navigate to="/sign-in" replace state={{ from: location.pathname }} />;

  const role = me.data.role;
  const link = ({ isActive }: { isActive: boolean }) =>
    `flex min-h-11 items-center whitespace-nowrap rounded-md px-2 xl:px-3 ${isActive ? 'bg-white/15 font-semibold' : 'hover:bg-white/10'}`;
  return (
    <div className="flex min-h-full flex-col">
      <header className="no-print flex flex-wrap items-center gap-x-2 bg-board px-3 py-1 text-white lg:flex-nowrap">
        <NavLink to="/" className="mr-2 flex items-center gap-2 font-semibold">
          <img src="/favicon.svg" alt="" className="h-7 w-7" /> Splitscope
        </NavLink>
        {/* One row from 1024 px (the admin has the most links); on a phone the links wrap under the name. */}
        <nav aria-label="Main" className="order-last flex w-full flex-wrap gap-1 lg:order-none lg:w-auto lg:flex-1 lg:flex-nowrap">
          {LINKS.filter((l) => !l.roles || hasRole(role, l.roles)).map((l) => (
            <NavLink key={l.to} to={l.to} end={l.end} className={link}>
              {l.short ? <Short short={l.short} long={l.label} /> : l.label}
            </NavLink>
          ))}
        </nav>
        <NavLink
          to="/account"
          className="ml-auto flex min-h-11 items-center whitespace-nowrap rounded-md px-2 text-sm hover:bg-white/10"
          title={`${me.data.name} · ${me.data.shopName}: your account`}
        >
          <span className="hidden xl:inline">{me.data.name} · </span>
          {roleLabels[me.data.role]}
          {/* The shop's name only where there is room: on a tablet the main links come first. */}
          <span className="hidden 2xl:inline"> · {me.data.shopName}</span>
        </NavLink>
        <button
          type="button"
          className="min-h-11 whitespace-nowrap rounded-md px-2 hover:bg-white/10"
          onClick={() => signOut.mutate(undefined, { onSuccess: () => void navigate('/sign-in') })}
        >
          Sign out
        </button>
      </header>
      <main className="flex-1 p-4">
        <Suspense
          fallback={
            <p role="status" className="p-4">
              Loading the screen…
            </p>
          }
        >
          <Outlet />
        </Suspense>
      </main>
    </div>
  );
}
