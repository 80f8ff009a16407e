import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DISCLOSURE_LEGAL_NOTE,
  chapterTimeToSeconds,
  composeDescription,
  descriptionLength,
  disclosureRequired,
  parseChapters,
  resolveDisclosure,
  secondsToChapterTime,
  withTrackingParams,
} from './description.ts';
import { ChannelSettingsSchema } from './schemas/channels.ts';
import {
  DESCRIPTION_MAX_CHARS_DEFAULT,
  DescriptionInputSchema,
  TITLE_MAX_CHARS_DEFAULT,
  type DescriptionInput,
} from './schemas/description.ts';

// Demo data: fictional brands and shops only (Korvala, Brightwell; example.* domains per RFC 2606).
const DEFAULT_DISCLOSURE =
  'Korvala loaned us the K9 body for this test and did not see the video before it went out.\n' +
  'The Korvala K9 body link pays us a commission if you buy through it.';

function fixtureInput(): DescriptionInput {
  return {
    title: 'Korvala K9 body: how far does base ISO stretch?',
    // Messy on purpose: CRLF, trailing spaces, leading and tripled blank lines must be tidied.
    summary:
      '\n  \nWe put the Korvala K9 body through an ISO sweep and a latitude bracket  \r\n' +
      'in our grey-card studio set.\r\n\r\n\r\n\r\nEverything was shot on the Brightwell 50mm at f/4.\n\n',
    // Tests and lines deliberately out of order: the text follows `order`, not array position.
    tests: [
      {
        name: 'Latitude bracket',
        order: 2,
        specLines: [
          { key: 'iso', label: 'ISO', value: '800', inDescription: true, order: 8 },
          { key: 'media', label: 'Media', value: 'Korvala 512 GB card', inDescription: false, order: 19 },
          { key: 'body', label: 'Body', value: 'Korvala K9', inDescription: true, order: 1 },
        ],
      },
      {
        name: 'ISO sweep',
        order: 1,
        specLines: [
          { key: 'codec', label: 'Codec', value: 'Korvala RAW HQ', inDescription: true, order: 12 },
          { key: 'frame_rate', label: 'Frame rate', value: '23.976 fps', inDescription: true, order: 4 },
          { key: 'body', label: 'Body', value: 'Korvala K9', inDescription: true, order: 1 },
          { key: 'lens', label: 'Lens', value: 'Brightwell 50mm f/1.4', inDescription: true, order: 2 },
          { key: 'shutter', label: 'Shutter', value: ' 180°  (1/48 s) ', inDescription: true, order: 5 },
          { key: 'nd', label: 'ND', value: '', inDescription: false, order: 7 },
        ],
      },
    ],
    chapters: [
      { label: 'Intro', startSeconds: 0 },
      { label: 'The set and the chart', startSeconds: 45 },
      { label: 'ISO sweep', startSeconds: 190 },
      { label: 'Noise at high ISO', startSeconds: 750 },
      { label: 'Verdict', startSeconds: 3723 },
    ],
    gearLinks: [
      { url: 'https://shop.example.com/korvala-k9?ref=midgray', label: 'Korvala K9 body', commission: true },
      { url: 'https://rental.example.org/brightwell-50', label: 'Brightwell 50mm', commission: false },
      { url: 'https://example.net/chart#grey', label: 'Our grey chart', commission: false },
    ],
    gear: [
      { name: 'Korvala K9 body', source: 'loaner', sponsored: false },
      { name: 'Brightwell 50mm', source: 'rental', sponsored: false },
    ],
    disclosure: '',
    signOff: 'Shot and graded by the Greycard Bench team.\nQuestions about the method? Ask in the comments.',
    settings: {
      descriptionMaxChars: DESCRIPTION_MAX_CHARS_DEFAULT,
      titleMaxChars: TITLE_MAX_CHARS_DEFAULT,
      trackingParams: [
        { key: 'src', value: 'greycard-bench' },
        { key: 'ref', value: 'greycard' },
      ],
      defaultDisclosure: DEFAULT_DISCLOSURE,
    },
  };
}

/** A bare input with only what a test sets. */
function bareInput(overrides: Partial<DescriptionInput> = {}): DescriptionInput {
  return {
    title: 'Brightwell 50mm at the bench',
    summary: 'Summary.',
    tests: [],
    chapters: [],
    gearLinks: [],
    gear: [],
    disclosure: '',
    signOff: '',
    settings: { descriptionMaxChars: 5000, titleMaxChars: 100, trackingParams: [], defaultDisclosure: '' },
    ...overrides,
  };
}

const codes = (input: DescriptionInput) => composeDescription(input).warnings.map((w) => w.code);

describe('composeDescription: the fixture', () => {
  // The fixture was written by hand from the layout rules in issue #7, then read line by line;
  // the file ends with one newline (editors add it), the composed text does not.
  const expected = readFileSync(new URL('./description.fixture.txt', import.meta.url), 'utf8').replace(/\n$/, '');

  it('produces exactly the fixture text, byte for byte, with no warnings', () => {
    const { text, warnings } = composeDescription(fixtureInput());
    expect(warnings).toEqual([]);
    expect(text).toBe(expected);
    expect(Buffer.from(text, 'utf8').equals(Buffer.from(expected, 'utf8'))).toBe(true);
  });

  it('is plain text: "\\n" line ends, no trailing whitespace, no doubled blank lines, no final newline', () => {
    const { text } = composeDescription(fixtureInput());
    expect(text).not.toMatch(/\r/);
    expect(text).not.toMatch(/[ \t]+$/m);
    expect(text).not.toMatch(/\n\n\n/);
    expect(text.endsWith('\n')).toBe(false);
  });

  it('gives the same text whatever the order of tests and spec lines in the input', () => {
    const tests = fixtureInput().tests;
    fc.assert(
      fc.property(
        fc.shuffledSubarray(tests, { minLength: tests.length, maxLength: tests.length }),
        fc.array(fc.integer(), { minLength: 20, maxLength: 20 }),
        (shuffledTests, seeds) => {
          const input = fixtureInput();
          input.tests = shuffledTests.map((t, i) => ({
            ...t,
            // Rotate each spec sheet by a random amount: insertion order must not matter.
            specLines: t.specLines.map((_, j, all) => all[(j + Math.abs(seeds[i])) % all.length]),
          }));
          expect(composeDescription(input).text).toBe(expected);
        },
      ),
    );
  });

  it('the input passes its own zod schema', () => {
    expect(DescriptionInputSchema.safeParse(fixtureInput()).success).toBe(true);
  });
});

describe('composeDescription: ordering', () => {
  it('orders spec lines by spec-sheet order, then key when two share an order', () => {
    const input = bareInput({
      summary: '',
      tests: [
        {
          name: 'Custom test',
          order: 1,
          specLines: [
            { key: 'wb', label: 'White balance', value: '5600 K', inDescription: true, order: 9 },
            { key: 'resolution', label: 'Resolution', value: '3840 × 2160', inDescription: true, order: 3 },
            { key: 'bit_depth', label: 'Bit depth', value: '10-bit', inDescription: true, order: 13 },
            { key: 'bitrate', label: 'Bitrate', value: '400 Mb/s', inDescription: true, order: 13 },
          ],
        },
      ],
    });
    expect(composeDescription(input).text).toBe(
      'Shooting specs\n\nCustom test\n- Resolution: 3840 × 2160\n- White balance: 5600 K\n- Bit depth: 10-bit\n- Bitrate: 400 Mb/s',
    );
  });

  it('orders tests by plan order, then name; a test with no line in the description is left out', () => {
    const line = { key: 'iso', label: 'ISO', value: '400', inDescription: true, order: 1 };
    const input = bareInput({
      summary: '',
      tests: [
        { name: 'Zebra check', order: 1, specLines: [line] },
        { name: 'Latitude bracket', order: 0, specLines: [line] },
        { name: 'Anamorphic squeeze', order: 1, specLines: [line] },
        { name: 'Hidden', order: 2, specLines: [{ ...line, inDescription: false }] },
      ],
    });
    expect(composeDescription(input).text).toBe(
      'Shooting specs\n\nLatitude bracket\n- ISO: 400\n\nAnamorphic squeeze\n- ISO: 400\n\nZebra check\n- ISO: 400',
    );
  });

  it('keeps chapters in the order given, so an out-of-order chapter is visible and warned about', () => {
    const chapters = [
      { label: 'Intro', startSeconds: 0 },
      { label: 'Verdict', startSeconds: 300 },
      { label: 'ISO sweep', startSeconds: 120 },
    ];
    const { text } = composeDescription(bareInput({ summary: '', chapters }));
    expect(text).toBe('Chapters\n0:00 Intro\n5:00 Verdict\n2:00 ISO sweep');
  });

  it('puts the sections in order: summary, specs, chapters, links, disclosure, sign-off', () => {
    const text = composeDescription(fixtureInput()).text;
    const at = (s: string) => text.indexOf(s);
    expect(at('We put')).toBe(0);
    expect(at('We put')).toBeLessThan(at('Shooting specs'));
    expect(at('Shooting specs')).toBeLessThan(at('Chapters'));
    expect(at('Chapters')).toBeLessThan(at('Gear links'));
    expect(at('Gear links')).toBeLessThan(at('Korvala loaned us'));
    expect(at('Korvala loaned us')).toBeLessThan(at('Shot and graded'));
  });

  it('lists warnings in a fixed order: title, length, chapters, spec lines, links, disclosure', () => {
    const input = bareInput({
      title: 'T'.repeat(101),
      summary: 'S'.repeat(5001),
      chapters: [{ label: 'Intro', startSeconds: 5 }],
      tests: [{ name: 'ISO sweep', order: 1, specLines: [{ key: 'codec', label: 'Codec', value: '', inDescription: true, order: 1 }] }],
      gearLinks: [{ url: 'ftp://files.example.com/k9.zip', label: 'Files', commission: true }],
    });
    expect(codes(input)).toEqual([
      'title_too_long',
      'description_too_long',
      'chapter_first_not_zero',
      'chapter_too_few',
      'spec_line_empty',
      'link_not_http',
      'disclosure_missing',
    ]);
  });
});

describe('composeDescription: length warnings', () => {
  // Limits: the video platform's title and description limits, `from memory` (100 and 5000 characters).
  it('warns when the title is over the limit, not at it', () => {
    expect(codes(bareInput({ title: 'K'.repeat(100) }))).toEqual([]);
    const w = composeDescription(bareInput({ title: 'K'.repeat(101) })).warnings;
    expect(w).toEqual([
      {
        code: 'title_too_long',
        message: 'The title has 101 characters; the limit is 100',
        fix: 'Shorten the title by at least 1 character',
      },
    ]);
  });

  it('uses the channel limit when set', () => {
    const input = bareInput({ title: 'Korvala K9 body review' });
    input.settings.titleMaxChars = 10;
    expect(composeDescription(input).warnings[0].message).toBe('The title has 22 characters; the limit is 10');
  });

  it('warns when the description is over the limit, not at it', () => {
    expect(codes(bareInput({ summary: 'x'.repeat(5000) }))).toEqual([]);
    const [w] = composeDescription(bareInput({ summary: 'x'.repeat(5003) })).warnings;
    expect(w.code).toBe('description_too_long');
    expect(w.message).toBe('The description has 5003 characters; the limit is 5000');
    expect(w.fix).toMatch(/^Cut at least 3 characters/);
  });

  it('counts characters as code points, so an emoji counts once', () => {
    // U+1F3A5 is one code point, two UTF-16 code units (The Unicode Standard, ch. 3.9, UTF-16).
    expect('🎥'.length).toBe(2);
    expect(descriptionLength('🎥')).toBe(1);
    expect(codes(bareInput({ title: '🎥'.repeat(100) }))).toEqual([]);
    // "é" typed as e + combining acute is made one code point by NFC (Unicode UAX #15).
    expect(descriptionLength(composeDescription(bareInput({ summary: 'e\u0301' })).text)).toBe(1);
  });
});

describe('composeDescription: chapter rules', () => {
  // The video platform's chapter rules, `from memory`: first at 0:00, at least three, ascending,
  // each at least 10 seconds long.
  const good = [
    { label: 'Intro', startSeconds: 0 },
    { label: 'ISO sweep', startSeconds: 10 },
    { label: 'Verdict', startSeconds: 20 },
  ];

  it('accepts three ascending chapters from 0:00 with 10-second gaps, and no chapters at all', () => {
    expect(codes(bareInput({ chapters: good }))).toEqual([]);
    expect(codes(bareInput({ chapters: [] }))).toEqual([]);
  });

  it('warns when the first chapter is not at 0:00', () => {
    const chapters = [{ label: 'Cold open', startSeconds: 5 }, ...good.slice(1).map((c) => ({ ...c, startSeconds: c.startSeconds + 5 }))];
    expect(composeDescription(bareInput({ chapters })).warnings).toEqual([
      {
        code: 'chapter_first_not_zero',
        message: 'The first chapter starts at 0:05; the video platform shows chapters only when the first starts at 0:00',
        fix: 'Add a chapter at 0:00 (for example "0:00 Intro") or move the first chapter to 0:00',
      },
    ]);
  });

  it('warns when there are fewer than three chapters', () => {
    expect(composeDescription(bareInput({ chapters: good.slice(0, 2) })).warnings).toEqual([
      {
        code: 'chapter_too_few',
        message: '2 chapters; the video platform shows chapters only when there are at least 3',
        fix: 'Add at least 1 more chapter, or remove the chapters',
      },
    ]);
    expect(composeDescription(bareInput({ chapters: good.slice(0, 1) })).warnings[0].fix).toBe(
      'Add at least 2 more chapters, or remove the chapters',
    );
  });

  it('warns when a chapter does not start after the one before it', () => {
    const chapters = [good[0], { label: 'Verdict', startSeconds: 300 }, { label: 'ISO sweep', startSeconds: 120 }];
    expect(composeDescription(bareInput({ chapters })).warnings).toEqual([
      {
        code: 'chapter_not_ascending',
        message: 'Chapter 3 (2:00 ISO sweep) does not start after chapter 2 (5:00 Verdict); chapters must be in time order',
        fix: 'Correct the start time of chapter 3 (2:00 ISO sweep) or move it to its place in time order',
      },
    ]);
    const same = [good[0], { label: 'A', startSeconds: 60 }, { label: 'B', startSeconds: 60 }];
    expect(codes(bareInput({ chapters: same }))).toEqual(['chapter_not_ascending']);
  });

  it('warns when a chapter lasts less than 10 seconds (9 s warns, 10 s does not)', () => {
    const chapters = [good[0], { label: 'ISO sweep', startSeconds: 9 }, { label: 'Verdict', startSeconds: 40 }];
    expect(composeDescription(bareInput({ chapters })).warnings).toEqual([
      {
        code: 'chapter_too_short',
        message: 'Chapter 1 (0:00 Intro) lasts 9 seconds; each chapter must last at least 10 seconds',
        fix: 'Start chapter 2 (0:09 ISO sweep) at 0:10 or later, or merge the two chapters',
      },
    ]);
  });

  it('checks the last chapter against the video length when it is known', () => {
    expect(codes(bareInput({ chapters: good, durationSeconds: 30 }))).toEqual([]);
    const short = composeDescription(bareInput({ chapters: good, durationSeconds: 25 })).warnings;
    expect(short).toEqual([
      {
        code: 'chapter_too_short',
        message: 'Chapter 3 (0:20 Verdict) lasts 5 seconds before the video ends; each chapter must last at least 10 seconds',
        fix: 'Start the last chapter at 0:15 or earlier, or remove it',
      },
    ]);
    const after = composeDescription(bareInput({ chapters: good, durationSeconds: 18 })).warnings;
    expect(after[0].message).toBe('Chapter 3 (0:20 Verdict) starts after the video ends (0:18)');
  });
});

describe('composeDescription: spec-sheet lines', () => {
  it('warns about a line marked "in description" but empty, and leaves it out of the text', () => {
    const input = bareInput({
      summary: '',
      tests: [
        {
          name: 'ISO sweep',
          order: 1,
          specLines: [
            { key: 'frame_rate', label: 'Frame rate', value: '25 fps', inDescription: true, order: 4 },
            { key: 'codec', label: 'Codec', value: '   ', inDescription: true, order: 12 },
            { key: 'lut', label: 'Monitoring LUT', value: '', inDescription: false, order: 16 },
          ],
        },
      ],
    });
    const { text, warnings } = composeDescription(input);
    expect(text).toBe('Shooting specs\n\nISO sweep\n- Frame rate: 25 fps');
    expect(warnings).toEqual([
      {
        code: 'spec_line_empty',
        message: 'ISO sweep: “Codec” is marked for the description but has no value, so it is left out',
        fix: 'Fill in Codec on the ISO sweep spec sheet, or untick "in description"',
      },
    ]);
  });

  it('keeps a value on one line: newlines and runs of spaces inside it become one space', () => {
    const input = bareInput({
      summary: '',
      tests: [{ name: 'ISO sweep', order: 1, specLines: [{ key: 'lighting', label: 'Lighting', value: 'Two LED panels\r\n at  5600 K', inDescription: true, order: 1 }] }],
    });
    expect(composeDescription(input).text).toBe('Shooting specs\n\nISO sweep\n- Lighting: Two LED panels at 5600 K');
  });
});

describe('links and tracking parameters', () => {
  // Expected serialisations follow the WHATWG URL Standard: the query keeps its existing bytes,
  // new pairs use the application/x-www-form-urlencoded serializer (space → "+", "&" → "%26"),
  // and the fragment stays last.
  const params = [
    { key: 'src', value: 'greycard bench' },
    { key: 'ref', value: 'a&b' },
  ];

  it('adds the channel parameters to a link without a query', () => {
    expect(withTrackingParams('https://shop.example.com/k9', params)).toEqual({
      ok: true,
      url: 'https://shop.example.com/k9?src=greycard+bench&ref=a%26b',
    });
  });

  it('does not add a parameter the link already has, and keeps the existing query as written', () => {
    expect(withTrackingParams('https://shop.example.com/k9?ref=own&q=a%20b', params)).toEqual({
      ok: true,
      url: 'https://shop.example.com/k9?ref=own&q=a%20b&src=greycard+bench',
    });
  });

  it('puts parameters before the fragment', () => {
    expect(withTrackingParams('https://example.net/chart#grey', params)).toEqual({
      ok: true,
      url: 'https://example.net/chart?src=greycard+bench&ref=a%26b#grey',
    });
  });

  it('adds a key listed twice in settings once (the first value wins)', () => {
    const twice = [{ key: 'src', value: 'one' }, { key: 'src', value: 'two' }];
    expect(withTrackingParams('https://example.com/x', twice)).toEqual({ ok: true, url: 'https://example.com/x?src=one' });
  });

  it('leaves the link exactly as typed when there is nothing to add', () => {
    // The URL serializer would add "/" after a bare host; the person's text must not change.
    expect(withTrackingParams('https://example.com', [])).toEqual({ ok: true, url: 'https://example.com' });
    expect(withTrackingParams('https://example.com?src=x', [{ key: 'src', value: 'y' }])).toEqual({ ok: true, url: 'https://example.com?src=x' });
  });

  it('refuses links that are not http(s)', () => {
    expect(withTrackingParams('ftp://files.example.com/k9.zip', params)).toEqual({ ok: false, reason: 'uses ftp:, not http or https' });
    expect(withTrackingParams('javascript:alert(1)', params)).toEqual({ ok: false, reason: 'uses javascript:, not http or https' });
    expect(withTrackingParams('www.example.com/k9', params)).toEqual({ ok: false, reason: 'is not a complete web address' });
  });

  it('warns about each non-web link in the description and prints it unchanged', () => {
    const input = bareInput({
      summary: '',
      gearLinks: [
        { url: 'www.example.com/k9', label: 'Korvala K9 body', commission: false },
        { url: 'https://example.com/b50', label: '', commission: false },
      ],
    });
    const { text, warnings } = composeDescription(input);
    expect(text).toBe('Gear links\nKorvala K9 body: www.example.com/k9\nhttps://example.com/b50');
    expect(warnings).toEqual([
      {
        code: 'link_not_http',
        message: 'The link “Korvala K9 body” (www.example.com/k9) is not a complete web address',
        fix: 'Use a full web address starting with https://',
      },
    ]);
  });
});

describe('disclosure rules', () => {
  // 16 CFR §255.5(a) (FTC Endorsement Guides): material connections include payment and "the
  // provision of free or discounted products" and "early access to a product" — hence loaned or
  // sponsored gear and commission links all require a disclosure.
  const gear = (source: 'loaner' | 'rental' | 'owned' | 'purchased', sponsored = false) => ({ name: 'Korvala K9 body', source, sponsored });

  it('requires one for loaned gear, sponsored gear and commission links, with the reasons', () => {
    expect(disclosureRequired({ gear: [gear('loaner')], gearLinks: [] })).toEqual({ required: true, reasons: ['Korvala K9 body is a loaner'] });
    expect(disclosureRequired({ gear: [gear('purchased', true)], gearLinks: [] })).toEqual({ required: true, reasons: ['Korvala K9 body is sponsored'] });
    expect(
      disclosureRequired({ gear: [], gearLinks: [{ url: 'https://shop.example.com/b50', label: 'Brightwell 50mm', commission: true }] }),
    ).toEqual({ required: true, reasons: ['the link “Brightwell 50mm” earns a commission'] });
    expect(disclosureRequired({ gear: [gear('loaner', true)], gearLinks: [] }).reasons).toEqual([
      'Korvala K9 body is a loaner',
      'Korvala K9 body is sponsored',
    ]);
  });

  it('does not require one for rented, owned or bought gear and plain links', () => {
    for (const source of ['rental', 'owned', 'purchased'] as const) {
      expect(disclosureRequired({ gear: [gear(source)], gearLinks: [{ url: 'https://example.com', label: 'x', commission: false }] })).toEqual({
        required: false,
        reasons: [],
      });
    }
  });

  it('warns when one is required and neither the episode nor the channel has one, deferring to local rules', () => {
    const input = bareInput({ gear: [gear('loaner')] });
    const { warnings } = composeDescription(input);
    expect(warnings).toHaveLength(1);
    expect(warnings[0].code).toBe('disclosure_missing');
    expect(warnings[0].message).toBe(`This description needs a disclosure: Korvala K9 body is a loaner. ${DISCLOSURE_LEGAL_NOTE}`);
    expect(warnings[0].message).toContain('16 CFR Part 255, §255.5');
    expect(warnings[0].message).toContain('legal advice');
    expect(warnings[0].fix).toBe('Write a disclosure for this episode, or set a default disclosure in the channel settings');
  });

  it("uses the channel default when the episode has none, and the episode's own text when it has one", () => {
    const input = bareInput({ summary: 'S.', gear: [gear('loaner')] });
    input.settings.defaultDisclosure = 'Korvala loaned us this body.';
    expect(composeDescription(input)).toEqual({ text: 'S.\n\nKorvala loaned us this body.', warnings: [] });
    input.disclosure = 'Korvala lent us the K9 for two weeks; they saw nothing before release.';
    expect(composeDescription(input).text).toBe('S.\n\nKorvala lent us the K9 for two weeks; they saw nothing before release.');
    expect(resolveDisclosure(input)).toBe('Korvala lent us the K9 for two weeks; they saw nothing before release.');
  });

  it('adds the channel default only when a disclosure is required, but always prints the episode own', () => {
    const input = bareInput({ summary: 'S.' });
    input.settings.defaultDisclosure = 'Default text.';
    expect(composeDescription(input).text).toBe('S.');
    input.disclosure = 'We bought this lens ourselves.';
    expect(composeDescription(input).text).toBe('S.\n\nWe bought this lens ourselves.');
  });
});

describe('chapter times', () => {
  // 1 min = 60 s and 1 h = 3600 s (BIPM SI Brochure, 9th ed., Table 8, non-SI units accepted for use).
  it.each([
    [0, '0:00'],
    [59, '0:59'],
    [60, '1:00'],
    [750, '12:30'],
    [3599, '59:59'],
    [3600, '1:00:00'],
    [3723, '1:02:03'],
    [36_000, '10:00:00'],
  ])('%i s ↔ %s', (seconds, text) => {
    expect(secondsToChapterTime(seconds)).toBe(text);
    expect(chapterTimeToSeconds(text)).toEqual({ seconds });
  });

  it('reads two-digit minutes and minutes past 59 in m:ss', () => {
    expect(chapterTimeToSeconds('00:00')).toEqual({ seconds: 0 });
    expect(chapterTimeToSeconds('75:00')).toEqual({ seconds: 4500 });
  });

  it('refuses impossible times with a reason', () => {
    expect(chapterTimeToSeconds('0:60')).toEqual({ error: '“0:60”: seconds go up to 59' });
    expect(chapterTimeToSeconds('1:60:00')).toEqual({ error: '“1:60:00”: minutes go up to 59 after the hours' });
    expect(chapterTimeToSeconds('1:5')).toEqual({ error: '“1:5”: write seconds with two digits, like 1:05' });
    expect(chapterTimeToSeconds('1:2:03')).toEqual({ error: '“1:2:03”: write minutes with two digits after the hours, like 1:02:03' });
    expect(chapterTimeToSeconds('12')).toEqual({ error: '“12” is not a time like 0:00, 12:30 or 1:02:03' });
  });
});

describe('parseChapters', () => {
  it('reads the usual pasted forms', () => {
    const pasted = '0:00 Intro\r\n1:02:03 - Latitude test\n\n12:30 ISO sweep\n[15:00] Verdict\n- 20:00 – Outro\n00:45: Set';
    expect(parseChapters(pasted)).toEqual({
      chapters: [
        { label: 'Intro', startSeconds: 0 },
        { label: 'Latitude test', startSeconds: 3723 },
        { label: 'ISO sweep', startSeconds: 750 },
        { label: 'Verdict', startSeconds: 900 },
        { label: 'Outro', startSeconds: 1200 },
        { label: 'Set', startSeconds: 45 },
      ],
      errors: [],
    });
  });

  it('reports each bad line by number and keeps the good ones', () => {
    const pasted = 'Chapters\n0:00 Intro\n0:75 Bad seconds\nIntro without time\n3:10\n1:60:00 Bad minutes\n4:00 Verdict';
    expect(parseChapters(pasted)).toEqual({
      chapters: [
        { label: 'Intro', startSeconds: 0 },
        { label: 'Verdict', startSeconds: 240 },
      ],
      errors: [
        { line: 3, text: '0:75 Bad seconds', message: 'Line 3: “0:75”: seconds go up to 59' },
        { line: 4, text: 'Intro without time', message: 'Line 4 does not start with a time: write it like 0:00 Intro' },
        { line: 5, text: '3:10', message: 'Line 5: the chapter at 3:10 has no label' },
        { line: 6, text: '1:60:00 Bad minutes', message: 'Line 6: “1:60:00”: minutes go up to 59 after the hours' },
      ],
    });
  });

  it('does not take a number glued to text for a time', () => {
    expect(parseChapters('12:30ISO sweep').chapters).toEqual([]);
    expect(parseChapters('1:02:03:04 Too many parts').errors).toHaveLength(1);
  });

  it('reads back the chapters section the composer writes', () => {
    const input = fixtureInput();
    const section = composeDescription({ ...bareInput({ summary: '' }), chapters: input.chapters }).text;
    expect(parseChapters(section)).toEqual({ chapters: input.chapters, errors: [] });
  });
});

describe('schemas', () => {
  it("default limits match the channel settings' defaults", () => {
    const defaults = ChannelSettingsSchema.parse({});
    expect(defaults.descriptionMaxChars).toBe(DESCRIPTION_MAX_CHARS_DEFAULT);
    expect(defaults.titleMaxChars).toBe(TITLE_MAX_CHARS_DEFAULT);
  });

  it('refuses a chapter without a label or with a negative start', () => {
    const base = fixtureInput();
    expect(DescriptionInputSchema.safeParse({ ...base, chapters: [{ label: '  ', startSeconds: 0 }] }).success).toBe(false);
    expect(DescriptionInputSchema.safeParse({ ...base, chapters: [{ label: 'Intro', startSeconds: -1 }] }).success).toBe(false);
  });
});
