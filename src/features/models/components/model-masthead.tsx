import { Link } from 'react-router-dom';
import { MODEL_KIND_LABELS } from '@shared/schemas/catalogue';
import type { ModelHeader } from '@shared/schemas/statistics';

export function ModelMasthead({
  model,
  note,
  firmware,
}: {
  model: ModelHeader;
  note: { body: string; pinnedAt: string } | null;
  firmware?: string;
}) {
  return (
    <header>
      <p className="text-caption text-ink-soft">
        <Link to="/scoreboard" className="hover:underline">
          Scoreboard
        </Link>{' '}
        / {model.maker.name}
        {firmware && (
          <>
            {' / '}
            <Link to={`/models/${model.slug}`} className="hover:underline">
              {model.name}
            </Link>
          </>
        )}
      </p>
      <h1 className="mt-1 text-title font-semibold text-ink">
        {model.maker.name} {model.name}
        {firmware && <span className="text-ink-soft"> · firmware {firmware}</span>}
      </h1>
      <p className="mt-1 text-ink-soft">
        {MODEL_KIND_LABELS[model.kind]}, measures {model.position} ·{' '}
        <Link to={model.threadsPath} className="text-fjord-700 underline">
          Discussion threads about this model
        </Link>
      </p>
      {model.hiddenReason && (
        <p role="status" className="mt-4 rounded-card bg-caution-100 px-4 py-3 text-caution-600">
          Left off the scoreboard by the moderators: {model.hiddenReason}
        </p>
      )}
      {note && (
        <aside className="mt-4 rounded-card border-l-4 border-fjord-500 bg-fjord-50 px-4 py-3">
          <p className="text-caption font-semibold uppercase tracking-wide text-fjord-700">Moderator's note</p>
          <p className="mt-1 whitespace-pre-line text-ink">{note.body}</p>
        </aside>
      )}
    </header>
  );
}
