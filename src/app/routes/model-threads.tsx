import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useMe } from '@/features/auth/api/get-me';
import { signInUrl } from '@/features/auth/sign-in-url';
import { ApiError } from '@/lib/api-client';
import { type ThreadFilters, useModelThreads } from '@/features/threads/api/get-model-threads';
import { NewThreadForm } from '@/features/threads/components/new-thread-form';
import { ThreadList } from '@/features/threads/components/thread-list';

const chip = (active: boolean) =>
  `rounded-full border px-3 py-1 text-caption font-medium ${active ? 'border-fjord-700 bg-fjord-700 text-paper' : 'border-paper-line text-ink-soft hover:border-fjord-300'}`;

export function ModelThreadsRoute() {
  const slug = useParams().slug!;
  const navigate = useNavigate();
  const me = useMe();
  const [filters, setFilters] = useState<ThreadFilters>({});
  const [writing, setWriting] = useState(false);
  const list = useModelThreads(slug, filters);

  if (list.isPending) return <p className="text-ink-soft">Loading threads…</p>;
  if (list.isError) {
    const notFound = list.error instanceof ApiError && list.error.status === 404;
    return (
      <div className="max-w-xl space-y-3 py-6">
        <h1 className="text-title font-semibold">{notFound ? 'No such model' : 'The threads could not be loaded'}</h1>
        <p className="text-ink-soft">{list.error.message}</p>
      </div>
    );
  }
  const { model, threads, total } = list.data;
  const toggle = (key: 'open' | 'makerResponded') => setFilters((f) => ({ ...f, [key]: f[key] ? undefined : true }));

  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <p className="text-caption font-semibold uppercase tracking-widest text-ember-700">{model.maker.name}</p>
        <h1 className="text-title font-semibold text-ink sm:text-display">{model.name}: discussions</h1>
        <p className="max-w-2xl text-ink-soft">
          What riders see with this meter, with their submissions as evidence, and what {model.maker.name} says about it.{' '}
          <Link to={`/models/${model.slug}`} className="font-medium text-fjord-700 underline underline-offset-2">
            The model's figures
          </Link>
        </p>
      </header>

      <fieldset className="flex flex-wrap items-center gap-2">
        <legend className="sr-only">Filter threads</legend>
        <button type="button" aria-pressed={!!filters.open} className={chip(!!filters.open)} onClick={() => toggle('open')}>
          Not fixed yet
        </button>
        <button
          type="button"
          aria-pressed={!!filters.makerResponded}
          className={chip(!!filters.makerResponded)}
          onClick={() => toggle('makerResponded')}
        >
          Maker responded
        </button>
        <label className="flex items-center gap-2 text-caption text-ink-soft">
          Firmware
          <select
            value={filters.firmwareId ?? ''}
            onChange={(e) => setFilters((f) => ({ ...f, firmwareId: e.target.value ? Number(e.target.value) : undefined }))}
            className="rounded-lg border border-paper-line bg-white px-2 py-1 text-caption"
          >
            <option value="">All</option>
            {model.firmware.map((f) => (
              <option key={f.id} value={f.id}>
                {f.version}
              </option>
            ))}
          </select>
        </label>
        <span className="ml-auto text-caption text-ink-faint">
          {total} {total === 1 ? 'thread' : 'threads'}, latest activity first
        </span>
      </fieldset>

      {writing ? (
        <NewThreadForm modelSlug={model.slug} firmware={model.firmware} onCreated={(id) => navigate(`/threads/${id}`)} />
      ) : me.data ? (
        <button
          type="button"
          onClick={() => setWriting(true)}
          className="rounded-full bg-fjord-700 px-5 py-2 font-medium text-paper hover:bg-fjord-900"
        >
          Report something
        </button>
      ) : (
        <a
          href={signInUrl(`/models/${model.slug}/threads`)}
          className="inline-block font-semibold text-fjord-700 underline underline-offset-2"
        >
          Sign in to start a thread
        </a>
      )}

      <ThreadList threads={threads} />
    </div>
  );
}
