import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import type { NotificationView } from '@shared/schemas/threads';
import { useMarkNotificationsRead } from '../api/mark-notifications-read';
import { useNotifications } from '../api/get-notifications';
import { formatAgo } from '../lib/format';

const KIND_TEXT: Record<NotificationView['kind'], string> = {
  reply: 'replied in',
  official_response: 'gave the official response in',
  status: 'The maker changed the status of',
};

/** The header's bell: unread count, and the latest notifications in a panel. Nothing for visitors. */
export function NotificationBell() {
  const notifications = useNotifications();
  const markRead = useMarkNotificationsRead();
  const [open, setOpen] = useState(false);
  const panel = useRef<HTMLDivElement>(null);

  useEffect(() => {
    if (!open) return;
    const close = (e: MouseEvent | KeyboardEvent) => {
      if (e instanceof KeyboardEvent ? e.key === 'Escape' : !panel.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', close);
    document.addEventListener('keydown', close);
    return () => {
      document.removeEventListener('mousedown', close);
      document.removeEventListener('keydown', close);
    };
  }, [open]);

  if (!notifications.data) return null;
  const { unreadCount, notifications: list } = notifications.data;
  return (
    <div ref={panel} className="relative">
      <button
        type="button"
        aria-expanded={open}
        aria-label={unreadCount ? `Notifications, ${unreadCount} unread` : 'Notifications'}
        onClick={() => setOpen(!open)}
        className="relative grid h-9 w-9 place-items-center rounded-full text-ink-soft hover:bg-paper-deep hover:text-ink"
      >
        <svg aria-hidden="true" viewBox="0 0 20 20" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth="1.6">
          <path d="M5 8a5 5 0 0 1 10 0c0 4 1.5 5.5 1.5 5.5h-13S5 12 5 8z" strokeLinejoin="round" />
          <path d="M8.2 16.2a2 2 0 0 0 3.6 0" strokeLinecap="round" />
        </svg>
        {unreadCount > 0 && (
          <span
            className="absolute -right-0.5 -top-0.5 min-w-5 rounded-full bg-ember-700 px-1 text-center text-[0.7rem] font-semibold leading-5 text-paper"
            data-testid="unread-count"
          >
            {unreadCount > 99 ? '99+' : unreadCount}
          </span>
        )}
      </button>
      {open && (
        <section
          className="absolute right-0 z-20 mt-2 w-80 rounded-card border border-paper-line bg-white p-2 shadow-card"
          aria-label="Notifications"
        >
          <div className="flex items-center justify-between px-2 py-1">
            <p className="text-caption font-semibold text-ink">Notifications</p>
            {unreadCount > 0 && (
              <button
                type="button"
                className="text-caption font-medium text-fjord-700 underline"
                onClick={() => markRead.mutate({ all: true })}
              >
                Mark all read
              </button>
            )}
          </div>
          {list.length === 0 ? (
            <p className="px-2 py-3 text-caption text-ink-faint">Nothing yet. Follow a thread to hear about replies.</p>
          ) : (
            <ul className="max-h-96 overflow-y-auto">
              {list.map((n) => (
                <li key={n.id}>
                  <Link
                    to={n.url}
                    onClick={() => {
                      setOpen(false);
                      if (!n.read) markRead.mutate({ ids: [n.id] });
                    }}
                    className={`block rounded-lg px-2 py-2 text-caption hover:bg-paper-deep ${n.read ? 'text-ink-soft' : 'font-medium text-ink'}`}
                  >
                    {!n.read && (
                      <>
                        <span className="mr-1.5 inline-block h-2 w-2 rounded-full bg-ember-500" aria-hidden="true" />
                        <span className="sr-only">Unread: </span>
                      </>
                    )}
                    {n.actor ? `${n.actor.name} ${KIND_TEXT[n.kind]}` : KIND_TEXT[n.kind]} “{n.thread.title}” ({n.thread.modelName})
                    <span className="block text-ink-faint">{formatAgo(n.createdAt)}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
