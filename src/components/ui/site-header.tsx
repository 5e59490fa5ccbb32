import { Link, NavLink } from 'react-router-dom';
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
  return (
    <header className="border-b border-paper-line bg-paper/90 backdrop-blur">
      <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-8 gap-y-3 px-5 py-4 sm:px-8">
        <Link to="/" aria-label="Crosswatt home">
          <Logo />
        </Link>
        <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
          {navItems.map((item) => (
            <NavLink
              key={item.to}
              to={item.to}
              end={item.end}
              className={({ isActive }) =>
                `rounded-full px-3.5 py-1.5 text-caption font-medium transition-colors ${
                  isActive ? 'bg-fjord-700 text-paper' : 'text-ink-soft hover:bg-paper-deep hover:text-ink'
                }`
              }
            >
              {item.label}
            </NavLink>
          ))}
          <ModerationNavLink />
        </nav>
        <NotificationBell />
        <UserMenu />
      </div>
    </header>
  );
}
