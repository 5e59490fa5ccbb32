// The demo's conversations: riders report what the firmware stories of world.ts
// make them see, link their accepted rides as evidence, and the makers' staff
// answer with an official response and a thread status; a moderator pins a note
// to a withdrawn firmware. Everything goes through the threads and curation
// services, as it would from the site. All names, places and words are ours.
import type { Knex } from 'knex';
import type { ThreadStatus } from '@shared/schemas/threads';
import type { Config } from '@server/config/env';
import { pinNote } from '@server/features/moderation/curation.service';
import { createThread, markOfficialResponse, replyToThread, setThreadStatus } from '@server/features/threads/threads.service';
import type { SessionUser } from '@server/features/users/users.service';
import { slugify } from '@shared/schemas/catalogue';
import type { PlannedSubmission } from './plan';

/** Which of the author's accepted rides a post links, clearest examples first. */
interface EvidenceWanted {
  firmware: string[];
  /** What makes a ride a good example: most dropouts of the model's side, or its highest bias. */
  showing: 'cadence_dropouts' | 'power_dropouts' | 'high_bias' | 'low_bias' | 'none';
  count: number;
}

interface ScriptedPost {
  author: string;
  body: string;
  evidence?: EvidenceWanted;
  /** A staff reply the maker marks as its official response. */
  official?: boolean;
}

interface ThreadScript {
  model: string;
  firmware: string | null;
  title: string;
  posts: [ScriptedPost, ...ScriptedPost[]];
  /** Set by the maker's staff after the posts. */
  status?: { by: string; status: Exclude<ThreadStatus, 'open'>; fixedIn?: string };
}

export const THREAD_SCRIPTS: ThreadScript[] = [
  {
    model: 'Larkspur Duo',
    firmware: '1.1',
    title: 'Cadence drops out on gravel since 1.1',
    posts: [
      {
        author: 'gideon-flaxman',
        body: 'On the quarry track the cadence on my Larkspur Duo goes blank for a few seconds, several times an hour. Power carries on, and smooth roads are better. Linked my two worst rides: my Wicket arm kept reading cadence through every gap.',
        evidence: { firmware: ['1.0', '1.1'], showing: 'cadence_dropouts', count: 2 },
      },
      {
        author: 'ottoline-brask',
        body: 'Same here on the washboard lanes above Carrowmede. Fewer gaps on tarmac, but never none.',
        evidence: { firmware: ['1.0', '1.1'], showing: 'cadence_dropouts', count: 1 },
      },
      {
        author: 'demo-staff-quillon-dynamics',
        official: true,
        body: "Thank you both, the linked rides made this easy to reproduce. On rough ground the pedal spindle vibration could trip the cadence sensor's debounce, and the pedal then held cadence back until the next clean revolution. Firmware **1.4** rewrites the debounce; update through the Quillon app and the gaps should go.",
      },
      {
        author: 'gideon-flaxman',
        body: 'Updated to 1.4 and rode the quarry track twice: no gaps at all. Linked one of them.',
        evidence: { firmware: ['1.4', '1.5'], showing: 'none', count: 1 },
      },
    ],
    status: { by: 'demo-staff-quillon-dynamics', status: 'fixed', fixedIn: '1.4' },
  },
  {
    model: 'Marrow Spider',
    firmware: '2.1',
    title: 'Marrow Spider reads about 2 % high since 2.1',
    posts: [
      {
        author: 'nell-ashdown',
        body: 'Before the update my Marrow and my Gannet Twin Arms agreed within half a percent. Since 2.1 the spider reads one and a half to two percent higher on every ride, zeroed or not.',
        evidence: { firmware: ['2.1'], showing: 'high_bias', count: 2 },
      },
      {
        author: 'clementine-vyse',
        body: 'I see it against my Wheelhouse hub too: the gap grew by about two points the day I updated.',
        evidence: { firmware: ['2.1'], showing: 'high_bias', count: 1 },
      },
      {
        author: 'demo-staff-sorrel-labs',
        official: true,
        body: 'Confirmed. Firmware 2.1 applied a strain-gauge correction twice, so power read about 2 % high. We have withdrawn 2.1; **2.2** carries the single correction again. Please update, and zero the spider once afterwards.',
      },
    ],
    status: { by: 'demo-staff-sorrel-labs', status: 'fixed', fixedIn: '2.2' },
  },
  {
    model: 'Drumlin Trainer',
    firmware: '5.2',
    title: 'Power drops to zero for a few seconds during intervals on 5.2',
    posts: [
      {
        author: 'tobin-quist',
        body: 'Since 5.2 the Drumlin loses power for three to ten seconds, three or four times an hour, often in the hard efforts. The pedals keep reading, so it is not me.',
        evidence: { firmware: ['5.2'], showing: 'power_dropouts', count: 2 },
      },
      {
        author: 'peregrine-sallow',
        body: 'Same on mine in the garage: the trainer stops broadcasting power while cadence carries on.',
        evidence: { firmware: ['5.2'], showing: 'power_dropouts', count: 1 },
      },
      {
        author: 'demo-staff-brindle-and-kite',
        official: true,
        body: 'We found it: 5.2 reset the power channel whenever the brake changed resistance quickly, which is why the drops come in intervals. Firmware **5.3** fixes it. Thank you for the rides, they pinned down the pattern.',
      },
    ],
    status: { by: 'demo-staff-brindle-and-kite', status: 'fixed', fixedIn: '5.3' },
  },
  {
    model: 'Wicket Left Arm',
    firmware: null,
    title: 'Wicket reads about 2 % above my pedals',
    posts: [
      {
        author: 'gideon-flaxman',
        body: 'Zeroed before every ride, and the Wicket still reads about two percent above my Larkspur Duo, ride after ride.',
        evidence: { firmware: ['3.0', '3.2'], showing: 'high_bias', count: 2 },
      },
      {
        author: 'ysolde-pinkerly',
        body: 'Against my Pip Pedals it is only about one percent, but the consensus figures say the Pips read high themselves. Both of us point the same way.',
        evidence: { firmware: ['3.0', '3.2'], showing: 'high_bias', count: 1 },
      },
      {
        author: 'demo-staff-brindle-and-kite',
        official: true,
        body: 'Thank you for the rides. We are checking the factory calibration of the 3.x production batches against our reference rig and will post here what we find.',
      },
    ],
    status: { by: 'demo-staff-brindle-and-kite', status: 'investigating' },
  },
  {
    model: 'Wheelhouse Hub',
    firmware: null,
    title: 'Wheelhouse Hub always a bit below my crank meters',
    posts: [
      {
        author: 'isaura-kell',
        body: 'My Wheelhouse Hub reads one and a half to two percent below my Pennant Pedals on every ride. Is it off?',
        evidence: { firmware: ['4.1', '4.2', '4.4'], showing: 'low_bias', count: 1 },
      },
      {
        author: 'demo-staff-halvard-cycleworks',
        official: true,
        body: "A hub sits after the chain, so it sees what the drivetrain lets through: around two percent less than the cranks or pedals, more with a dirty chain. That is expected, and Crosswatt's consensus figures allow for it. A clean, well-lubed chain narrows the gap.",
      },
    ],
    status: { by: 'demo-staff-halvard-cycleworks', status: 'acknowledged' },
  },
  {
    model: 'Nib Pedals',
    firmware: '0.9',
    title: 'First rides on the Nib Pedals 0.9',
    posts: [
      {
        author: 'quentin-sparrowhawk',
        body: 'Only a couple of rides so far against my Lumen Spider. Close, but too few to say much. Anyone else riding them?',
        evidence: { firmware: ['0.8', '0.9'], showing: 'none', count: 2 },
      },
      {
        author: 'lucan-merriweather',
        body: 'Thinking of getting a pair. Please keep uploading, I will watch this thread.',
      },
    ],
  },
];

/** The moderator's note: the firmware its maker withdrew. */
export const PINNED_NOTE = {
  model: 'Marrow Spider',
  firmware: '2.1',
  moderator: 'demo-moderator',
  body: 'Firmware 2.1 was withdrawn by Sorrel Labs: it reads about 2 % high. Update to 2.2; see the thread on this model.',
};

export interface ConversationContext {
  db: Knex;
  config: Config;
  people: Map<string, SessionUser>;
  firmwareIds: Map<string, number>;
  plan: PlannedSubmission[];
  submissionIds: number[];
}

/** Creates the scripted threads and the pinned note; returns how many threads and posts. */
export async function seedThreadsAndNotes(ctx: ConversationContext): Promise<{ threads: number; posts: number }> {
  const deps = { db: ctx.db, config: ctx.config };
  const person = (handle: string) => {
    const user = ctx.people.get(handle);
    if (!user) throw new Error(`the demo world has no person ${handle}`);
    return user;
  };
  const firmwareId = (model: string, version: string) => {
    const id = ctx.firmwareIds.get(`${model}@${version}`);
    if (!id) throw new Error(`the demo world has no firmware ${model} ${version}`);
    return id;
  };
  let posts = 0;
  for (const script of THREAD_SCRIPTS) {
    const [opening, ...replies] = script.posts;
    const { id: threadId } = await createThread(deps, person(opening.author), slugify(script.model), {
      title: script.title,
      body: opening.body,
      firmwareId: script.firmware ? firmwareId(script.model, script.firmware) : null,
      submissionIds: await evidenceFor(ctx, script.model, opening),
    });
    posts += 1;
    for (const reply of replies) {
      const { id: postId } = await replyToThread(deps, person(reply.author), threadId, {
        body: reply.body,
        submissionIds: await evidenceFor(ctx, script.model, reply),
      });
      if (reply.official) await markOfficialResponse(deps, person(reply.author), threadId, postId);
      posts += 1;
    }
    if (script.status) {
      const fixedInFirmwareId = script.status.fixedIn ? firmwareId(script.model, script.status.fixedIn) : null;
      await setThreadStatus(deps, person(script.status.by), threadId, { status: script.status.status, fixedInFirmwareId });
    }
  }
  await pinNote(ctx.db, {
    subject: 'firmware',
    id: firmwareId(PINNED_NOTE.model, PINNED_NOTE.firmware),
    body: PINNED_NOTE.body,
    actorId: person(PINNED_NOTE.moderator).id,
  });
  return { threads: THREAD_SCRIPTS.length, posts };
}

/**
 * The accepted rides a post links: the author's own rides of the model with the
 * wanted firmware, the clearest examples first. Small seeds may have
 * none; the post then links nothing.
 */
async function evidenceFor(ctx: ConversationContext, model: string, post: ScriptedPost): Promise<number[]> {
  const wanted = post.evidence;
  if (!wanted) return [];
  const candidates = ctx.plan.flatMap((planned) => {
    if (planned.rider !== post.author || planned.outcome.decision !== 'accept' || planned.flaw) return [];
    const side: 'a' | 'b' | null = planned.a.model === model ? 'a' : planned.b.model === model ? 'b' : null;
    if (!side || !wanted.firmware.includes(planned[side].firmware)) return [];
    return [{ id: ctx.submissionIds[planned.index], side }];
  });
  if (candidates.length === 0) return [];
  const rows: Array<{
    id: number;
    status: string;
    bias_percent: number | null;
    a_power_dropouts: number;
    a_cadence_dropouts: number;
    b_power_dropouts: number;
    b_cadence_dropouts: number;
  }> = await ctx
    .db('submissions')
    .whereIn(
      'id',
      candidates.map((c) => c.id),
    )
    .select('id', 'status', 'bias_percent', 'a_power_dropouts', 'a_cadence_dropouts', 'b_power_dropouts', 'b_cadence_dropouts');
  const byId = new Map(rows.map((row) => [row.id, row]));
  const strength = ({ id, side }: { id: number; side: 'a' | 'b' }) => {
    const row = byId.get(id)!;
    if (wanted.showing === 'cadence_dropouts') return row[`${side}_cadence_dropouts`] ?? 0;
    if (wanted.showing === 'power_dropouts') return row[`${side}_power_dropouts`] ?? 0;
    if (wanted.showing === 'none') return 0;
    // bias_percent is A against B; from B's side it is (nearly) the negative.
    const bias = (side === 'a' ? 1 : -1) * (row.bias_percent ?? 0);
    return wanted.showing === 'high_bias' ? bias : -bias;
  };
  return candidates
    .filter((c) => byId.get(c.id)?.status === 'accepted')
    .sort((x, y) => strength(y) - strength(x) || x.id - y.id)
    .slice(0, wanted.count)
    .map((c) => c.id);
}
