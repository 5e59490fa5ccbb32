import { useEffect, useState } from 'react';
import type { CompareOptions } from '@shared/analysis/types';
import type { PairPreviewAnswer, PairPreviewRequest } from '../workers/pair-preview';

export type PairPreviewState = { status: 'idle' } | { status: 'working' } | { status: 'done'; answer: PairPreviewAnswer };

async function previewInWorker(request: PairPreviewRequest, signal: AbortSignal): Promise<PairPreviewAnswer> {
  if (typeof Worker === 'undefined') return previewHere(request);
  return new Promise((resolve) => {
    const worker = new Worker(new URL('../workers/pair-preview.worker.ts', import.meta.url), { type: 'module' });
    const finish = (answer: Promise<PairPreviewAnswer> | PairPreviewAnswer) => {
      worker.terminate();
      resolve(answer);
    };
    signal.addEventListener('abort', () => worker.terminate());
    worker.onmessage = (event: MessageEvent<PairPreviewAnswer>) => finish(event.data);
    // A browser that refuses module workers still gets a preview, on the main thread.
    worker.onerror = (event) => {
      event.preventDefault();
      finish(previewHere(request));
    };
    worker.postMessage(request, [request.aBytes, request.bBytes]);
  });
}

async function previewHere(request: PairPreviewRequest): Promise<PairPreviewAnswer> {
  const { runPairPreview } = await import('../workers/run-pair-preview');
  return runPairPreview(request);
}

/** Decodes and compares both files in the browser whenever the files or the positions change. */
export function usePairPreview(fileA: File | null, fileB: File | null, options: CompareOptions): PairPreviewState {
  const [state, setState] = useState<PairPreviewState>({ status: 'idle' });
  const { aPosition, bPosition, aAfterDrivetrain, bAfterDrivetrain } = options;

  useEffect(() => {
    if (!fileA || !fileB) {
      setState({ status: 'idle' });
      return;
    }
    const controller = new AbortController();
    setState({ status: 'working' });
    (async () => {
      const [aBytes, bBytes] = await Promise.all([fileA.arrayBuffer(), fileB.arrayBuffer()]);
      const answer = await previewInWorker(
        { aBytes, bBytes, options: { aPosition, bPosition, aAfterDrivetrain, bAfterDrivetrain } },
        controller.signal,
      );
      if (!controller.signal.aborted) setState({ status: 'done', answer });
    })().catch(() => {
      if (!controller.signal.aborted) {
        setState({
          status: 'done',
          answer: { ok: false, error: { code: 'preview_failed', message: 'These files could not be read in the browser.', side: null } },
        });
      }
    });
    return () => controller.abort();
  }, [fileA, fileB, aPosition, bPosition, aAfterDrivetrain, bAfterDrivetrain]);

  return state;
}
