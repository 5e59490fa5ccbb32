import { useState } from 'react';
import type { PostView, ThreadDetail } from '@shared/schemas/threads';
import { useEditPost } from '../api/edit-post';
import { useSetPostVisibility } from '../api/hide-post';
import { useMarkOfficialResponse } from '../api/mark-official-response';
import { formatDay } from '@/lib/format-date';
import { quietButtonClass } from './form-field';
import { LinkedSubmissions } from './linked-submissions';
import { MakerStaffBadge } from './maker-staff-badge';
import { PostBody } from './post-body';
import { PostForm } from './post-form';

interface PostCardProps {
  post: PostView;
  thread: ThreadDetail;
  /** The copy pinned at the top of the thread. */
  pinned?: boolean;
}

export function PostCard({ post, thread, pinned = false }: PostCardProps) {
  const [editing, setEditing] = useState(false);
  const edit = useEditPost(thread.id, thread.model.slug);
  const official = useMarkOfficialResponse(thread.id, thread.model.slug);
  const visibility = useSetPostVisibility(thread.id, thread.model.slug);
  const byStaff = post.staffOf?.id === thread.model.maker.id;
  const canMarkOfficial = thread.viewer.isMakerStaff && byStaff && !post.isOpening && !post.hidden && !pinned;

  function hide() {
    const reason = window.prompt('Why is this post hidden? The reason is shown in its place.');
    if (reason?.trim()) visibility.mutate({ postId: post.id, hidden: true, reason: reason.trim() });
  }

  return (
    <article
      id={pinned ? undefined : `post-${post.id}`}
      aria-label={pinned ? `Official response from ${post.staffOf?.name ?? 'the maker'}` : `Post by ${post.author.name}`}
      className={`rounded-card border p-5 ${
        pinned ? 'border-fjord-500 bg-fjord-50 shadow-card' : byStaff ? 'border-fjord-300 bg-white' : 'border-paper-line bg-white'
      }`}
    >
      {pinned && <p className="mb-2 text-caption font-semibold uppercase tracking-widest text-fjord-700">Official response</p>}
      <header className="mb-3 flex flex-wrap items-center gap-x-3 gap-y-1">
        <span className="font-semibold text-ink">{post.author.name}</span>
        {post.author.handle && <span className="text-caption text-ink-faint">@{post.author.handle}</span>}
        {post.staffOf && <MakerStaffBadge makerName={post.staffOf.name} />}
        {post.isOfficialResponse && !pinned && (
          <span className="rounded-full bg-fjord-100 px-2 py-0.5 text-caption font-semibold text-fjord-900">Official response</span>
        )}
        <time dateTime={post.createdOn} className="text-caption text-ink-faint">
          {formatDay(post.createdOn)}
        </time>
        {post.editedOn && (
          <span className="text-caption italic text-ink-faint" title={`Edited ${formatDay(post.editedOn)}`}>
            edited
          </span>
        )}
      </header>

      {post.hidden && (
        <p className="rounded-lg bg-paper-deep px-3 py-2 text-caption text-ink-soft" data-testid="hidden-post">
          Hidden by a moderator: {post.hidden.reason}
        </p>
      )}
      {editing && post.bodySource !== null ? (
        <PostForm
          modelSlug={thread.model.slug}
          label="Edit your post"
          submitLabel="Save"
          initialBody={post.bodySource}
          linkSubmissions={false}
          pending={edit.isPending}
          error={edit.error}
          onSubmit={async (input) => {
            await edit.mutateAsync({ postId: post.id, body: input.body });
            setEditing(false);
          }}
          onCancel={() => setEditing(false)}
        />
      ) : (
        post.bodyHtml !== null && <PostBody html={post.bodyHtml} />
      )}
      <LinkedSubmissions submissions={post.linkedSubmissions} />

      {!pinned && (
        <footer className="mt-3 flex flex-wrap gap-2">
          {post.bodySource !== null && !editing && !thread.locked && (
            <button type="button" className={quietButtonClass} onClick={() => setEditing(true)}>
              Edit
            </button>
          )}
          {canMarkOfficial && !post.isOfficialResponse && (
            <button type="button" className={quietButtonClass} disabled={official.isPending} onClick={() => official.mutate(post.id)}>
              Mark as official response
            </button>
          )}
          {thread.viewer.isMakerStaff && post.isOfficialResponse && (
            <button type="button" className={quietButtonClass} disabled={official.isPending} onClick={() => official.mutate(null)}>
              Withdraw official response
            </button>
          )}
          {thread.viewer.canModerate &&
            (post.hidden ? (
              <button type="button" className={quietButtonClass} onClick={() => visibility.mutate({ postId: post.id, hidden: false })}>
                Show again
              </button>
            ) : (
              <button type="button" className={quietButtonClass} onClick={hide}>
                Hide…
              </button>
            ))}
          {(official.error || visibility.error) && (
            <p role="alert" className="text-caption font-medium text-alert-600">
              {(official.error ?? visibility.error)!.message}
            </p>
          )}
        </footer>
      )}
    </article>
  );
}
