import { type FormEvent, useState } from 'react';
import type { CurrentUser } from '@shared/schemas/auth';
import { updateAccountInput } from '@shared/schemas/auth';
import { useUpdateAccount } from '../api/update-account';

/** Display name and e-mail notification preferences, saved together. */
export function AccountSettingsForm({ me }: { me: CurrentUser }) {
  const [name, setName] = useState(me.name);
  const [prefs, setPrefs] = useState(me.notificationPrefs);
  const [problem, setProblem] = useState<string>();
  const update = useUpdateAccount();

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = updateAccountInput.safeParse({ name, notificationPrefs: prefs });
    if (!parsed.success) return setProblem(parsed.error.issues[0]?.message);
    setProblem(undefined);
    update.mutate(parsed.data, { onError: (error) => setProblem(error.message) });
  }

  return (
    <form onSubmit={submit} className="space-y-5" noValidate>
      <div>
        <label htmlFor="account-name" className="mb-1 block font-medium">
          Name shown with your posts
        </label>
        <input
          id="account-name"
          value={name}
          onChange={(e) => setName(e.target.value)}
          maxLength={80}
          aria-invalid={!!problem}
          aria-describedby={problem ? 'account-problem' : undefined}
          className="w-full max-w-md rounded-lg border border-paper-line bg-white px-3 py-2 focus:border-fjord-500"
        />
      </div>
      <fieldset className="space-y-2">
        <legend className="mb-1 font-medium">E-mail me when…</legend>
        <label className="flex items-center gap-2">
          <input
            type="checkbox"
            checked={prefs.emailOnDecision}
            onChange={(e) => setPrefs({ ...prefs, emailOnDecision: e.target.checked })}
          />
          a moderator accepts or rejects one of my submissions
        </label>
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={prefs.emailOnReply} onChange={(e) => setPrefs({ ...prefs, emailOnReply: e.target.checked })} />
          someone replies in a thread I take part in
        </label>
      </fieldset>
      {problem && (
        <p id="account-problem" role="alert" className="text-caption font-medium text-alert-800">
          {problem}
        </p>
      )}
      <div className="flex items-center gap-3">
        <button
          type="submit"
          disabled={update.isPending}
          className="rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900 disabled:opacity-60"
        >
          Save
        </button>
        {update.isSuccess && !problem && (
          <span role="status" className="text-caption text-moss-700">
            Saved.
          </span>
        )}
      </div>
    </form>
  );
}
