import { asBuffer } from '../submissions/fit-pairs';
import { submissionMeta, type TestCatalogue } from './catalogue-factory';
import type { signedInAgent } from './sign-in';

/** POST /api/submissions as a signed-in rider: the two FIT files and the catalogue's default tags. */
export async function uploadPair(
  rider: Awaited<ReturnType<typeof signedInAgent>>,
  catalogue: TestCatalogue,
  pair: { a: Uint8Array; b: Uint8Array },
) {
  return rider.agent
    .post('/api/submissions')
    .set('X-CSRF-Token', await rider.csrf())
    .field('meta', JSON.stringify(submissionMeta(catalogue)))
    .attach('fileA', asBuffer(pair.a), 'a.fit')
    .attach('fileB', asBuffer(pair.b), 'b.fit');
}
