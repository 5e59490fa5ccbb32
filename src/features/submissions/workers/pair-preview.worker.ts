import type { PairPreviewRequest } from './pair-preview';
import { runPairPreview } from './run-pair-preview';

// Decoding and aligning two rides takes a moment; doing it here keeps the form responsive.
const scope = self as unknown as {
  postMessage(message: unknown): void;
  onmessage: ((event: MessageEvent<PairPreviewRequest>) => void) | null;
};
scope.onmessage = (event) => scope.postMessage(runPairPreview(event.data));
