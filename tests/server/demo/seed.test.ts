import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoWorld, type SeedDemoReport } from '../../../seeds/demo-world/seed-demo';
import { injectedTruth } from '../../../seeds/demo-world/truth';
import { PINNED_NOTE, THREAD_SCRIPTS } from '../../../seeds/demo-world/threads';
import { slugify } from '@shared/schemas/catalogue';
import { MAKERS, MODELS, RECORDING_DEVICES, RIDERS, STAFF } from '../../../seeds/demo-world/world';
import { signInThroughFakeProvider } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

const { app, db } = await createTestContext({ fakes: true });

// A small world (about 20 submissions) at a fixed date, so the test is quick and repeatable.
const NOW = Date.UTC(2026, 10, 15, 12) / 1000;
const SMALL = { db, now: NOW, scale: 0.03 };
/** A like-for-like ride of 25–75 min recovers the meters' injected gain ratio this closely (measured worst: 0.64 % over the full demo). */
const BIAS_TOLERANCE_PERCENT = 1;

let report: SeedDemoReport;
beforeAll(async () => {
  report = await seedDemoWorld(SMALL);
}, 120_000);

const countRows = async (table: string) => Number((await db(table).count({ n: '*' }).first())!.n);

describe('seeding the demo world', () => {
  it('when the database is empty, then the whole fictional catalogue is created and approved', async () => {
    const res = await request(app).get('/api/catalogue');

    expect(res.status).toBe(200);
    expect(res.body.makers.map((m: { name: string }) => m.name).sort()).toEqual(MAKERS.map((m) => m.name).sort());
    expect(res.body.models).toHaveLength(MODELS.length);
    expect(res.body.firmware).toHaveLength(MODELS.reduce((n, m) => n + m.firmware.length, 0));
    expect(res.body.recordingDevices).toHaveLength(RECORDING_DEVICES.length);
    const marrow = res.body.models.find((m: { name: string }) => m.name === 'Marrow Spider');
    expect(marrow).toMatchObject({ position: 'total', kind: 'spider', status: 'approved' });
  });

  it('when the demo people exist, then they have their roles and maker staff can sign in on the fake provider', async () => {
    const roles = await db('role_grants').join('users', 'users.id', 'role_grants.user_id').select('users.handle', 'role_grants.role');
    const holders = (role: string) => roles.filter((r) => r.role === role).map((r) => r.handle);
    expect(holders('admin')).toContain('demo-admin');
    expect(holders('moderator')).toEqual(expect.arrayContaining(['demo-moderator', 'demo-moderator-odile', 'demo-moderator-kasim']));
    expect(holders('rider')).toEqual(expect.arrayContaining(RIDERS.map((r) => r.handle)));
    expect(RIDERS.length).toBeGreaterThanOrEqual(44);

    const agent = request.agent(app);
    await signInThroughFakeProvider(agent, 'demo-staff-sorrel-labs');
    const me = await agent.get('/api/me');

    expect(me.body.handle).toBe('demo-staff-sorrel-labs');
    expect(me.body.makers.map((m: { slug: string }) => m.slug)).toEqual(['sorrel-labs']);
    expect(STAFF.filter((p) => p.makerSlug).length).toBeGreaterThanOrEqual(3);
  });

  it("when the owners of the battery-story model have logged their batteries, then its page says the latest firmware's batteries run flat sooner, beside the maker's claim", async () => {
    const story = MODELS.find((m) => m.battery)!;
    const { body } = await request(app).get(`/api/models/${slugify(story.name)}/conditions`);

    expect(report.batteries).toBeGreaterThan(30);
    expect(body.claim).toEqual({ hours: story.battery!.claimHours, source: story.battery!.claimSource });
    const latest = body.firmware.at(-1);
    const before = body.firmware.at(-2);
    // world.ts: 1.3's true median is 200 h against 400 h on 1.1.
    expect(latest.againstPredecessor.verdict).toBe('worse');
    expect(latest.life.medianHours).toBeGreaterThan(120);
    expect(latest.life.medianHours).toBeLessThan(280);
    expect(before.life.medianHours).toBeGreaterThan(300);
    expect(body.batteryLife.riders).toBe(RIDERS.filter((r) => r.meters.includes(story.name)).length);
  });

  it("when the rides are uploaded, then every one is analysed by the real job and ends as its moderator's plan says", async () => {
    const rows = await db('submissions').select('id', 'status').whereIn('id', report.submissionIds);
    const statusOf = new Map(rows.map((row) => [row.id, row.status]));
    const expected = { accept: 'accepted', reject: 'rejected', pending: 'awaiting_review' } as const;

    expect(report.seeded).toBe(true);
    expect(report.plan.length).toBeGreaterThanOrEqual(12);
    expect(report.failed).toBe(0);
    for (const planned of report.plan) expect(statusOf.get(report.submissionIds[planned.index])).toBe(expected[planned.outcome.decision]);
    expect(report.decided).toBe(report.plan.filter((p) => p.outcome.decision !== 'pending').length);
  });

  it("when a like-for-like ride is analysed, then its measured bias is within tolerance of the meters' injected gains", async () => {
    const clean = report.plan.filter((p) => !p.flaw);
    const rows = await db('submissions')
      .select('id', 'bias_percent', 'like_for_like_mode')
      .whereIn(
        'id',
        clean.map((p) => report.submissionIds[p.index]),
      );
    const byId = new Map(rows.map((row) => [row.id, row]));

    for (const planned of clean) {
      const row = byId.get(report.submissionIds[planned.index])!;
      const injected = 100 * (planned.a.gain / planned.b.gain - 1);
      expect(row.like_for_like_mode).not.toBe('mixed');
      expect(Math.abs(row.bias_percent - injected), `ride ${planned.index}: ${planned.a.model} vs ${planned.b.model}`).toBeLessThan(
        BIAS_TOLERANCE_PERCENT,
      );
    }
  });

  it('when a ride is flawed on purpose, then the engine raises the flag a moderator should see', async () => {
    const expectedFlag = {
      other_ride: 'low_correlation',
      uncalibrated: 'large_bias',
      mixed: 'mixed_comparison',
      short: 'short_overlap',
    } as const;
    const flawed = report.plan.filter((p) => p.flaw && p.flaw in expectedFlag);
    expect(flawed.length).toBeGreaterThanOrEqual(4);

    for (const planned of flawed) {
      const row = await db('submissions').where({ id: report.submissionIds[planned.index] }).first('flags');
      expect(row.flags.map((f: { code: string }) => f.code)).toContain(expectedFlag[planned.flaw as keyof typeof expectedFlag]);
    }
  });

  it('when the truth is asked for, then every model and firmware has one entry with its bias as injected and as measured', () => {
    const truth = injectedTruth(report.plan);
    const of = (model: string, firmware: string) => truth.find((t) => t.model === model && t.firmware === firmware)!;

    expect(truth).toHaveLength(MODELS.reduce((n, m) => n + m.firmware.length, 0));
    expect(of('Marrow Spider', '2.1').biasPercent - of('Marrow Spider', '2.0').biasPercent).toBeCloseTo(2, 5);
    expect(of('Drumlin Trainer', '5.2').measuredBiasPercent).toBeCloseTo(100 * ((1 - 0.006) * (1 - 0.021) - 1), 5);
  });

  it("when the demo's threads are read, then riders' reports carry maker answers with an official response and a status", async () => {
    const summaries = await Promise.all(THREAD_SCRIPTS.map((script) => request(app).get(`/api/models/${slugify(script.model)}/threads`)));
    const threads = summaries.flatMap((res) => res.body.threads);
    const larkspur = await request(app).get(`/api/threads/${summaries[0].body.threads[0].id}`);

    expect(report.threads).toBe(THREAD_SCRIPTS.length);
    expect(threads).toHaveLength(THREAD_SCRIPTS.length);
    expect(new Set(threads.map((t: { status: string }) => t.status))).toEqual(new Set(['fixed', 'investigating', 'acknowledged', 'open']));
    expect(threads.filter((t: { hasOfficialResponse: boolean }) => t.hasOfficialResponse)).toHaveLength(
      THREAD_SCRIPTS.filter((s) => s.posts.some((p) => p.official)).length,
    );
    expect(larkspur.body).toMatchObject({ status: 'fixed', fixedIn: { version: '1.4' }, firmware: { version: '1.1' } });
    expect(larkspur.body.posts).toHaveLength(THREAD_SCRIPTS[0].posts.length);
    expect(larkspur.body.officialResponse).toMatchObject({
      author: { handle: 'demo-staff-quillon-dynamics' },
      staffOf: { name: 'Quillon Dynamics' },
    });
    // Riders speak for no maker, whatever they write.
    expect(larkspur.body.posts.filter((p: { staffOf: unknown }) => p.staffOf)).toHaveLength(1);
  });

  it('when the withdrawn firmware is opened, then its pinned moderator note is shown', async () => {
    const res = await request(app).get(`/api/models/${slugify(PINNED_NOTE.model)}/firmware/${PINNED_NOTE.firmware}`);

    expect(res.status).toBe(200);
    expect(res.body.note.body).toBe(PINNED_NOTE.body);
  });

  it('when the seed runs a second time, then nothing changes', async () => {
    const tables = [
      'makers',
      'models',
      'firmware_versions',
      'recording_devices',
      'users',
      'role_grants',
      'maker_staff',
      'submissions',
      'submission_recordings',
      'threads',
      'posts',
      'moderator_notes',
    ];
    const before = await Promise.all(tables.map(countRows));

    const again = await seedDemoWorld(SMALL);

    expect(again.seeded).toBe(false);
    expect(await Promise.all(tables.map(countRows))).toEqual(before);
  });
});
