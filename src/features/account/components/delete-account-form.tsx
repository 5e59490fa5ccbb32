import { type FormEvent, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useDeleteAccount } from '../api/delete-account';

/** Deleting needs the handle typed out; what stays and what goes is said first. */
export function DeleteAccountForm({ handle }: { handle: string }) {
  const [confirmHandle, setConfirmHandle] = useState('');
  const navigate = useNavigate();
  const remove = useDeleteAccount({ onSuccess: () => navigate('/') });

  function submit(event: FormEvent) {
    event.preventDefault();
    remove.mutate({ confirmHandle });
  }

  return (
    <form onSubmit={submit} className="space-y-3">
      <p className="text-ink-soft">
        Your name, handle and e-mail address are removed and you are signed out. The statistics from your submissions stay in the pooled
        figures, no longer linked to you, and your posts show “deleted rider”. This cannot be undone.
      </p>
      <label htmlFor="confirm-handle" className="block font-medium">
        Type your handle, <span className="font-semibold">{handle}</span>, to confirm
      </label>
      <input
        id="confirm-handle"
        value={confirmHandle}
        onChange={(e) => setConfirmHandle(e.target.value)}
        autoComplete="off"
        className="w-full max-w-xs rounded-lg border border-paper-line bg-white px-3 py-2 focus:border-alert-600"
      />
      {remove.isError && (
        <p role="alert" className="text-caption font-medium text-alert-800">
          {remove.error.message}
        </p>
      )}
      <button
        type="submit"
        disabled={confirmHandle.trim().toLowerCase() !== handle || remove.isPending}
        className="block rounded-full bg-alert-600 px-5 py-2 font-medium text-white hover:bg-alert-800 disabled:cursor-not-allowed disabled:opacity-50"
      >
        Delete my account
      </button>
    </form>
  );
}
