import { type QueryKey, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export type NoteSubject = 'model' | 'firmware';

/** Pins (or replaces) the note on a model or firmware page; `body: null` takes it down. */
export function pinNote({
  subject,
  id,
  body,
}: {
  subject: NoteSubject;
  id: number;
  body: string | null;
}): Promise<{ subject: NoteSubject; id: number; note: string | null }> {
  const path = `/api/moderation/catalogue/${subject}/${id}/note`;
  return body === null ? api.delete(path) : api.put(path, { body });
}

/** `affects`: the pages that show the note, as their own query keys (the page composing this passes them). */
export function usePinNote(affects: QueryKey[]) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: pinNote,
    onSuccess: () => affects.forEach((queryKey) => void queryClient.invalidateQueries({ queryKey })),
  });
}
