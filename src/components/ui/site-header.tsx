import { Link, NavLink } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { UserMenu } from '@/features/auth/components/user-menu';
import { ModerationNavLink } from '@/features/moderation/components/moderation-nav-link';
import { NotificationBell } from '@/features/threads/components/notification-bell';
import { Logo } from './logo';

const navItems = [
  { to: '/', label: 'Overview', end: true },
  { to: '/scoreboard', label: 'Scoreboard', end: false },
  { to: '/submit', label: 'Submit a ride', end: false },
  { to: '/methodology', label: 'Method', end: false },
];

export function SiteHeader() {
  const me = useMe();
  return (
    <header className="border-b border-paper-line bg-paper/90 backdrop-blur">
      <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-6 gap-y-2 px-5 py-3 sm:px-8 md:flex-nowrap md:py-4">
        <Link to="/" aria-label="Crosswatt home" className="shrink-0">
          <Logo />
        </Link>
        {/* On a phone the links take a row of their own and scroll sideways rather than wrap. */}
        <nav
          aria-label="Main"
          className="order-last -mx-1 flex w-full gap-1 overflow-x-auto px-1 pb-1 md:order-none md:w-auto md:flex-1 md:pb-0"
        >
          {navItems.map((item) => (
            <NavLink
              key={item.to}
              to={item.to}
              end={item.end}
              className={({ isActive }) =>
                `shrink-0 whitespace-nowrap rounded-full px-3.5 py-1.5 text-caption font-medium transition-colors ${
                  isActive ? 'bg-fjord-700 text-paper' : 'text-ink-soft hover:bg-paper-deep hover:text-ink'
                }`
              }
            >
              {item.label}
            </NavLink>
          ))}
          <ModerationNavLink />
        </nav>
        <div className="ml-auto flex shrink-0 items-center gap-2">
          {me.data && <NotificationBell />}
          <UserMenu />
        </div>
      </div>
    </header>
  );
}
