import { Link, useParams } from 'react-router-dom';
import { signInUrl } from '@/features/auth/sign-in-url';
import { ApiError } from '@/lib/api-client';
import { useSetFollowing } from '@/features/threads/api/follow-thread';
import { useThread } from '@/features/threads/api/get-thread';
import { useReplyToThread } from '@/features/threads/api/reply-to-thread';
import { quietButtonClass } from '@/features/threads/components/form-field';
import { ModeratorPanel } from '@/features/threads/components/moderator-panel';
import { PostCard } from '@/features/threads/components/post-card';
import { PostForm } from '@/features/threads/components/post-form';
import { StaffStatusPanel } from '@/features/threads/components/staff-status-panel';
import { ThreadStatusBadge } from '@/features/threads/components/thread-status-badge';

export function ThreadRoute() {
  const id = Number(useParams().id);
  const thread = useThread(id);
  const slug = thread.data?.model.slug ?? '';
  const replyMutation = useReplyToThread(id, slug);
  const follow = useSetFollowing(id, slug);

  if (thread.isPending) return <p className="text-ink-soft">Loading the thread…</p>;
  if (thread.isError) {
    const notFound = thread.error instanceof ApiError && (thread.error.status === 404 || thread.error.status === 400);
    return (
      <div className="max-w-xl space-y-3 py-6">
        <h1 className="text-title font-semibold">{notFound ? 'No such thread' : 'This thread could not be loaded'}</h1>
        <p className="text-ink-soft">{thread.error.message}</p>
      </div>
    );
  }
  const t = thread.data;
  return (
    <div className="grid gap-8 lg:grid-cols-[1fr_18rem]">
      <div className="min-w-0 space-y-5">
        <header className="space-y-3">
          <Link to={`/models/${t.model.slug}/threads`} className="text-caption font-semibold text-fjord-700 underline underline-offset-2">
            {t.model.maker.name} {t.model.name} · all threads
          </Link>
          <h1 className="text-title font-semibold text-ink">{t.title}</h1>
          <div className="flex flex-wrap items-center gap-2 text-caption text-ink-soft">
            <ThreadStatusBadge status={t.status} fixedIn={t.fixedIn} />
            {t.firmware && <span className="rounded-full bg-paper-deep px-2.5 py-0.5">Firmware {t.firmware.version}</span>}
            {t.locked && (
              <span className="rounded-full bg-alert-100 px-2.5 py-0.5 font-semibold text-alert-800">Locked by a moderator</span>
            )}
            {t.movedFrom && <span>Moved here from {t.movedFrom.name}</span>}
          </div>
        </header>

        {t.officialResponse && <PostCard post={t.officialResponse} thread={t} pinned />}
        {t.posts.map((post) => (
          <PostCard key={post.id} post={post} thread={t} />
        ))}

        {t.viewer.canReply ? (
          <section aria-label="Reply" className="rounded-card border border-paper-line bg-white p-5">
            <PostForm
              modelSlug={t.model.slug}
              label={t.viewer.isMakerStaff ? `Reply as ${t.model.maker.name} staff` : 'Your reply'}
              submitLabel="Post reply"
              pending={replyMutation.isPending}
              error={replyMutation.error}
              linkSubmissions={!t.viewer.isMakerStaff}
              onSubmit={(input) => replyMutation.mutateAsync(input)}
            />
          </section>
        ) : t.locked ? (
          <p className="rounded-card bg-paper-deep p-4 text-ink-soft">This thread is locked: it takes no new replies.</p>
        ) : (
          <a href={signInUrl(`/threads/${t.id}`)} className="inline-block font-semibold text-fjord-700 underline underline-offset-2">
            Sign in to reply
          </a>
        )}
      </div>

      <aside className="space-y-4">
        {t.viewer.signedIn && (
          <button type="button" className={quietButtonClass} disabled={follow.isPending} onClick={() => follow.mutate(!t.viewer.following)}>
            {t.viewer.following ? 'Stop following' : 'Follow this thread'}
          </button>
        )}
        {t.viewer.isMakerStaff && <StaffStatusPanel key={`${t.status}-${t.fixedIn?.id}`} thread={t} />}
        {t.viewer.canModerate && <ModeratorPanel thread={t} />}
        <p className="text-caption text-ink-faint">
          {t.replyCount} {t.replyCount === 1 ? 'reply' : 'replies'} · started by {t.author.name}
        </p>
      </aside>
    </div>
  );
}
