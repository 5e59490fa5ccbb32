import { formatDay } from '@/lib/format-date';
import { type FormEvent, useState } from 'react';
import { GRANTABLE_ROLES } from '@shared/roles';
import type { AdminUser } from '@shared/schemas/auth';
import { useChangeMakerStaff } from '../api/change-maker-staff';
import { useChangeRole } from '../api/change-role';
import { useMakers } from '../api/get-makers';
import { useUsers } from '../api/get-users';

/** People, searchable, with their roles and maker membership editable in place. */
export function UsersTable() {
  const [draft, setDraft] = useState('');
  const [query, setQuery] = useState({ q: '', page: 1 });
  const users = useUsers(query);
  const makers = useMakers();
  const changeRole = useChangeRole();
  const changeStaff = useChangeMakerStaff();
  const problem = changeRole.error?.message ?? changeStaff.error?.message;

  function search(event: FormEvent) {
    event.preventDefault();
    setQuery({ q: draft.trim(), page: 1 });
  }

  const pages = users.data ? Math.max(1, Math.ceil(users.data.total / users.data.pageSize)) : 1;

  return (
    <div className="space-y-4">
      <search>
        <form onSubmit={search} className="flex flex-wrap items-end gap-2">
          <div>
            <label htmlFor="user-search" className="mb-1 block text-caption font-medium text-ink-soft">
              Search by name, handle or e-mail
            </label>
            <input
              id="user-search"
              value={draft}
              onChange={(e) => setDraft(e.target.value)}
              className="w-72 rounded-lg border border-paper-line bg-white px-3 py-2"
            />
          </div>
          <button type="submit" className="rounded-full bg-fjord-700 px-4 py-2 font-medium text-paper hover:bg-fjord-900">
            Search
          </button>
        </form>
      </search>
      {problem && (
        <p role="alert" className="rounded-lg bg-alert-100 px-3 py-2 text-caption font-medium text-alert-800">
          {problem}
        </p>
      )}
      {users.isError && (
        <p role="alert" className="text-alert-800">
          Could not load people: {users.error.message}
        </p>
      )}
      {users.data && (
        <>
          <p className="text-caption text-ink-soft" role="status">
            {users.data.total} {users.data.total === 1 ? 'person' : 'people'}
            {query.q && ` matching “${query.q}”`}
          </p>
          <div className="overflow-x-auto rounded-card border border-paper-line bg-white shadow-card">
            <table className="w-full text-left text-caption">
              <thead className="bg-paper-deep text-ink-soft">
                <tr>
                  <th scope="col" className="px-4 py-2 font-semibold">
                    Person
                  </th>
                  {GRANTABLE_ROLES.map((role) => (
                    <th key={role} scope="col" className="px-4 py-2 font-semibold capitalize">
                      {role}
                    </th>
                  ))}
                  <th scope="col" className="px-4 py-2 font-semibold">
                    Verified staff of
                  </th>
                  <th scope="col" className="px-4 py-2 font-semibold">
                    Joined
                  </th>
                </tr>
              </thead>
              <tbody>
                {users.data.users.map((user) => (
                  <UserRow
                    key={user.id}
                    user={user}
                    makers={makers.data?.makers ?? []}
                    busy={changeRole.isPending || changeStaff.isPending}
                    onRole={(role, grant) => changeRole.mutate({ userId: user.id, role, grant })}
                    onMaker={(makerId) => changeStaff.mutate({ userId: user.id, makerId })}
                  />
                ))}
              </tbody>
            </table>
          </div>
          <nav aria-label="Pages of people" className="flex items-center gap-3">
            <button
              type="button"
              disabled={query.page <= 1}
              onClick={() => setQuery({ ...query, page: query.page - 1 })}
              className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
            >
              Previous
            </button>
            <span className="text-caption text-ink-soft">
              Page {query.page} of {pages}
            </span>
            <button
              type="button"
              disabled={query.page >= pages}
              onClick={() => setQuery({ ...query, page: query.page + 1 })}
              className="rounded-full border border-paper-line px-3 py-1 disabled:opacity-40"
            >
              Next
            </button>
          </nav>
        </>
      )}
    </div>
  );
}

function UserRow({
  user,
  makers,
  busy,
  onRole,
  onMaker,
}: {
  user: AdminUser;
  makers: { id: number; name: string }[];
  busy: boolean;
  onRole: (role: (typeof GRANTABLE_ROLES)[number], grant: boolean) => void;
  onMaker: (makerId: number | null) => void;
}) {
  const label = user.deleted ? 'deleted rider' : `${user.name} (@${user.handle})`;
  return (
    <tr className="border-t border-paper-line align-middle">
      <th scope="row" className="px-4 py-2 font-normal">
        <span className={`block font-medium ${user.deleted ? 'italic text-ink-faint' : 'text-ink'}`}>
          {user.deleted ? 'deleted rider' : user.name}
        </span>
        {!user.deleted && (
          <span className="text-ink-faint">
            @{user.handle}
            {user.email && ` · ${user.email}`}
          </span>
        )}
      </th>
      {GRANTABLE_ROLES.map((role) => (
        <td key={role} className="px-4 py-2">
          <input
            type="checkbox"
            aria-label={`${role} — ${label}`}
            checked={user.roles.includes(role)}
            disabled={busy || user.deleted}
            onChange={(e) => onRole(role, e.target.checked)}
            className="h-4 w-4 accent-fjord-700"
          />
        </td>
      ))}
      <td className="px-4 py-2">
        <select
          aria-label={`Maker staff — ${label}`}
          value={user.maker?.id ?? ''}
          disabled={busy || user.deleted}
          onChange={(e) => onMaker(e.target.value ? Number(e.target.value) : null)}
          className="rounded-lg border border-paper-line bg-white px-2 py-1"
        >
          <option value="">— not staff —</option>
          {makers.map((maker) => (
            <option key={maker.id} value={maker.id}>
              {maker.name}
            </option>
          ))}
        </select>
      </td>
      <td className="px-4 py-2 text-ink-soft">{formatDay(user.createdAt)}</td>
    </tr>
  );
}
