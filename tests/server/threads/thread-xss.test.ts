import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { type Person, reply, startThread } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let attacker: Person;
let threadId: number;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  attacker = await signedInAgent(app, { handle: 'mischief-rider' });
  threadId = (await startThread(attacker, catalogue.spider.slug)).body.id;
});

// Whatever the input, the stored and served HTML may only contain these tags,
// links only with http(s)/mailto and always rel="nofollow ugc noopener".
const ALLOWED_TAGS = new Set(['p', 'br', 'strong', 'em', 'code', 'pre', 'blockquote', 'ul', 'ol', 'li', 'a']);

// In the HTML every "<" that is not escaped opens a real tag, so checking the
// tags checks everything the browser would treat as markup; escaped text is inert.
function expectInert(html: string) {
  for (const [tag, name, attributes] of html.matchAll(/<\/?([a-z0-9]+)([^>]*)>/gi)) {
    expect(ALLOWED_TAGS, `tag ${tag} in ${html}`).toContain(name.toLowerCase());
    if (tag.startsWith('</')) expect(attributes).toBe('');
    else if (name === 'a') expect(tag).toMatch(/^<a href="(https?:|mailto:)[^"]*" rel="nofollow ugc noopener">$/);
    else if (name === 'ol') expect(attributes).toMatch(/^( start="\d+")?$/);
    else expect(attributes, `attributes of ${tag}`).toBe('');
  }
}

const ATTACKS: Array<[string, string]> = [
  ['a script tag', '<script>alert(1)</script> hello'],
  ['an image with onerror', '<img src=x onerror=alert(1)>'],
  ['a Markdown image from another site (tracking)', '![pixel](https://tracker.example/p.gif?u=1)'],
  ['a javascript: link', '[click](javascript:alert(document.cookie))'],
  ['an entity-encoded javascript: link', '[click](jav&#x61;script:alert(1))'],
  ['a data: link', '[click](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)'],
  ['a link title breaking out of its attribute', '[x](https://ok.example "a\\" onmouseover=\\"alert(1)")'],
  ['an iframe', '<iframe src="https://evil.example"></iframe>'],
  ['a style tag', '<style>body{display:none}</style>'],
  ['an svg with onload', '<svg onload=alert(1)>'],
  ['raw HTML inside a list', '- <a href="javascript:alert(1)">x</a>'],
  ['a bare link', 'see https://example.test/a?b=1'],
];

describe('post bodies cannot carry script, tracking or unsafe links', () => {
  it.each(ATTACKS)('when a reply contains %s, then the stored and the served HTML are inert', async (_name, body) => {
    const res = await reply(attacker, threadId, body);

    expect(res.status).toBe(201);
    const stored = await db('posts').where({ id: res.body.id }).first();
    expect(stored.body_source).toBe(body.trim());
    expectInert(stored.body_html);
    const served = await request(app).get(`/api/threads/${threadId}`);
    const post = served.body.posts.find((p: { id: number }) => p.id === res.body.id);
    expect(post.bodyHtml).toBe(stored.body_html);
    expectInert(post.bodyHtml);
  });

  it('when a reply has a plain link, then it is kept and marked nofollow ugc', async () => {
    const res = await reply(attacker, threadId, 'Notes at [my log](https://example.test/log)');

    const stored = await db('posts').where({ id: res.body.id }).first();
    expect(stored.body_html).toBe('<p>Notes at <a href="https://example.test/log" rel="nofollow ugc noopener">my log</a></p>');
  });

  it('when a reply has a Markdown image, then no image is rendered at all', async () => {
    const res = await reply(attacker, threadId, '![pixel](https://tracker.example/p.gif)');

    const stored = await db('posts').where({ id: res.body.id }).first();
    expect(stored.body_html).not.toContain('<img');
  });
});

describe('titles are plain text', () => {
  it('when a title contains markup, then it is stored and served as the same plain text (the page shows it as text)', async () => {
    const title = '<img src=x onerror=alert(1)> drops <b>out</b>';

    const res = await startThread(attacker, catalogue.spider.slug, { title });

    expect(res.status).toBe(201);
    expect((await db('threads').where({ id: res.body.id }).first()).title).toBe(title);
    const list = await request(app).get(`/api/models/${catalogue.spider.slug}/threads`);
    expect(list.body.threads.find((t: { id: number }) => t.id === res.body.id).title).toBe(title);
    expect(list.headers['content-type']).toMatch(/^application\/json/);
  });

  it('when a title contains control characters, then the answer is 400', async () => {
    const res = await startThread(attacker, catalogue.spider.slug, { title: 'Power drops \u0000 to zero on climbs' });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toHaveProperty('title');
  });
});
