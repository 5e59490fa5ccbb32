import { describe, expect, it } from 'vitest';
import { proposeCatalogueEntryInput } from '@shared/schemas/catalogue';
import { boundedWholeNumber, idNumber, singleLineText } from '@shared/schemas/fields';
import { curateEntryInput } from '@shared/schemas/moderation';
import { createThreadInput } from '@shared/schemas/threads';

describe('ids', () => {
  it.each([[true], [false], [[]], [''], ['1.5'], [0], [-3], ['abc'], [null]])('when the id is %j, then it is refused', (value) => {
    expect(idNumber().safeParse(value).success).toBe(false);
  });

  it('when the id is a number or digits from a form, then it reads as that number', () => {
    expect(idNumber().parse(7)).toBe(7);
    expect(idNumber().parse(' 42 ')).toBe(42);
    expect(boundedWholeNumber(1, 10).parse('3')).toBe(3);
    expect(boundedWholeNumber(1, 10).safeParse('11').success).toBe(false);
  });
});

describe('names', () => {
  const injected = 'Spokesworth\r\nBcc: everyone@example.test';

  it.each([
    ['a maker proposal', () => proposeCatalogueEntryInput.safeParse({ type: 'maker', name: injected })],
    [
      'a recording device proposal',
      () => proposeCatalogueEntryInput.safeParse({ type: 'recording_device', name: 'Unit\u0007Bell', kind: 'head_unit' }),
    ],
    ['a rename in curation', () => curateEntryInput.safeParse({ action: 'rename', name: injected })],
    ['a thread title', () => createThreadInput.safeParse({ title: 'Cadence drops\u0000 every minute', body: 'It drops.' })],
    ['a name with a DEL character', () => singleLineText().safeParse('Quill\u007fon')],
  ])('when %s carries control characters, then it is refused', (_what, parse) => {
    const result = parse();

    expect(result.success).toBe(false);
    expect(JSON.stringify(result.error?.issues)).toMatch(/one line of plain text/);
  });

  it('when a name is plain text with accents, then it is accepted', () => {
    expect(proposeCatalogueEntryInput.parse({ type: 'maker', name: 'Ørsted & Fils' })).toEqual({ type: 'maker', name: 'Ørsted & Fils' });
  });
});
