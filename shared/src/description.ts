/**
 * The description composer (issue #7): turns the parts a team edits — summary, spec-sheet lines,
 * chapters, links, disclosure, sign-off — into the plain text pasted into the video platform, plus
 * warnings a person can act on.
 *
 * Pure and deterministic: web (live preview) and api (stored version, approval checks) must produce
 * byte-identical text, so nothing here depends on locale, time or environment — ties are broken by
 * code-unit comparison, never `localeCompare`, and numbers are printed without locale formatting.
 */
import {
  CHAPTER_FIRST_START_SECONDS,
  CHAPTER_MIN_COUNT,
  CHAPTER_MIN_SECONDS,
  type Chapter,
  type ComposedDescription,
  type DescriptionGear,
  type DescriptionGearLink,
  type DescriptionInput,
  type DescriptionSettings,
  type DescriptionWarning,
} from './schemas/description.ts';

/** Shown with the missing-disclosure warning and beside the disclosure editor. */
export const DISCLOSURE_LEGAL_NOTE =
  'What a disclosure must say, and where, is set by local advertising rules (in the US, the FTC\'s ' +
  'Endorsement Guides, 16 CFR Part 255, §255.5 on disclosure of material connections); ask for legal ' +
  'advice when unsure. Midgray only checks that a disclosure is there, not that it is enough: a line ' +
  'in the description may also need to be said in the video and be visible without expanding the text.';

const SECTION_SEPARATOR = '\n\n';

// ---------------------------------------------------------------------------------------------------
// Text normalisation: the same input always gives the same bytes.

// C0 controls except tab and newline, and DEL: invisible, and they break the platform's text box.
const CONTROL_CHARS = /[\u0000-\u0008\u000B-\u001F\u007F]/g;

/** One-line text: NFC, controls removed, every run of whitespace (newlines too) made one space. */
function inlineText(value: string): string {
  return value.normalize('NFC').replace(/\r\n?/g, '\n').replace(CONTROL_CHARS, '').replace(/\s+/g, ' ').trim();
}

/** Multi-line text: NFC, "\n" line ends, no trailing spaces, no leading/trailing or doubled blank lines. */
function blockText(value: string): string {
  const lines = value
    .normalize('NFC')
    .replace(/\r\n?/g, '\n')
    .replace(CONTROL_CHARS, '')
    .split('\n')
    .map((line) => line.trimEnd());
  const kept: string[] = [];
  for (const line of lines) {
    if (line === '' && (kept.length === 0 || kept[kept.length - 1] === '')) continue;
    kept.push(line);
  }
  while (kept.length > 0 && kept[kept.length - 1] === '') kept.pop();
  return kept.join('\n');
}

/** Code-unit order: identical in every engine, unlike localeCompare. */
function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Length as a person counts it: Unicode code points, so an emoji counts once, not twice. */
export function descriptionLength(text: string): number {
  let count = 0;
  for (const _ of text) count++;
  return count;
}

const quote = (s: string) => `“${s}”`;
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

// ---------------------------------------------------------------------------------------------------
// Chapter times: "m:ss" below an hour, "h:mm:ss" from an hour on.

/** "0:00", "12:30", "1:02:03" — whole seconds as a chapter time (fractions are dropped). */
export function secondsToChapterTime(seconds: number): string {
  const total = Math.max(0, Math.floor(seconds));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = String(total % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${s}` : `${m}:${s}`;
}

/** Whole seconds of "m:ss" or "h:mm:ss" (minutes above 59 allowed in "m:ss"), or an error to show. */
export function chapterTimeToSeconds(text: string): { seconds: number } | { error: string } {
  const parts = text.trim().split(':');
  if (parts.length < 2 || parts.length > 3 || parts.some((p) => !/^\d+$/.test(p))) {
    return { error: `${quote(text)} is not a time like 0:00, 12:30 or 1:02:03` };
  }
  const secondsPart = parts[parts.length - 1];
  if (secondsPart.length !== 2) return { error: `${quote(text)}: write seconds with two digits, like 1:05` };
  const seconds = Number(secondsPart);
  if (seconds >= 60) return { error: `${quote(text)}: seconds go up to 59` };
  if (parts.length === 3) {
    const [hours, minutes] = [Number(parts[0]), Number(parts[1])];
    if (parts[1].length !== 2) return { error: `${quote(text)}: write minutes with two digits after the hours, like 1:02:03` };
    if (minutes >= 60) return { error: `${quote(text)}: minutes go up to 59 after the hours` };
    return { seconds: hours * 3600 + minutes * 60 + seconds };
  }
  return { seconds: Number(parts[0]) * 60 + seconds };
}

/** A pasted line that could not become a chapter: 1-based line number, its text and why. */
export interface ChapterParseError {
  line: number;
  text: string;
  message: string;
}

// Optional list marker, a time (optionally in brackets), an optional separator, the label.
const CHAPTER_LINE = /^(?:[-*•]\s+)?[[(]?(\d+(?::\d+){1,2})[\])]?(?=\s|$|[-–—:|])\s*(?:[-–—:|]\s*)?(.*)$/u;

/**
 * Chapters from pasted text, one per line: "0:00 Intro", "1:02:03 - Latitude test", "12:30 ISO sweep".
 * Blank lines and a "Chapters" heading are skipped; every other line either becomes a chapter (in the pasted order, so the
 * chapter checks can point at a line out of order) or an error naming the line.
 */
export function parseChapters(pastedText: string): { chapters: Chapter[]; errors: ChapterParseError[] } {
  const chapters: Chapter[] = [];
  const errors: ChapterParseError[] = [];
  const lines = pastedText.normalize('NFC').replace(/\r\n?/g, '\n').split('\n');
  lines.forEach((raw, index) => {
    const text = raw.trim();
    // Blank lines, and a "Chapters" heading copied along with the lines, are not chapters.
    if (text === '' || /^chapters:?$/i.test(text)) return;
    const line = index + 1;
    const match = CHAPTER_LINE.exec(text);
    if (!match) {
      errors.push({ line, text, message: `Line ${line} does not start with a time: write it like 0:00 Intro` });
      return;
    }
    const time = chapterTimeToSeconds(match[1]);
    if ('error' in time) {
      errors.push({ line, text, message: `Line ${line}: ${time.error}` });
      return;
    }
    const label = inlineText(match[2]);
    if (label === '') {
      errors.push({ line, text, message: `Line ${line}: the chapter at ${match[1]} has no label` });
      return;
    }
    chapters.push({ label, startSeconds: time.seconds });
  });
  return { chapters, errors };
}

// ---------------------------------------------------------------------------------------------------
// Links

export type LinkCheck = { ok: true; url: string } | { ok: false; reason: string };

/**
 * The link with the channel's tracking parameters added (a key already in the URL is left as it is),
 * or why it is not a web link. Existing query text is kept byte for byte; only new pairs are appended.
 */
export function withTrackingParams(rawUrl: string, trackingParams: DescriptionSettings['trackingParams']): LinkCheck {
  const raw = rawUrl.trim();
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    return { ok: false, reason: 'is not a complete web address' };
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    return { ok: false, reason: `uses ${url.protocol.slice(0, -1)}:, not http or https` };
  }
  const seen = new Set<string>();
  const toAdd: [string, string][] = [];
  for (const { key, value } of trackingParams) {
    if (key === '' || seen.has(key) || url.searchParams.has(key)) continue;
    seen.add(key);
    toAdd.push([key, value]);
  }
  // Nothing to add: keep the person's text exactly (the URL serialiser would, e.g., add a trailing "/").
  if (toAdd.length === 0) return { ok: true, url: raw };
  const added = new URLSearchParams(toAdd).toString();
  url.search = url.search.length > 1 ? `${url.search}&${added}` : `?${added}`;
  return { ok: true, url: url.toString() };
}

// ---------------------------------------------------------------------------------------------------
// Disclosure

/**
 * Whether the description must carry a disclosure, and why: any gear that is a loaner or sponsored,
 * any link that earns a commission (a material connection in the sense of 16 CFR §255.5). The API
 * refuses approval when `required` and the composed description has no disclosure.
 */
export function disclosureRequired(input: {
  gear: readonly DescriptionGear[];
  gearLinks: readonly DescriptionGearLink[];
}): { required: boolean; reasons: string[] } {
  const reasons: string[] = [];
  for (const item of input.gear) {
    const name = inlineText(item.name);
    if (item.source === 'loaner') reasons.push(`${name} is a loaner`);
    if (item.sponsored) reasons.push(`${name} is sponsored`);
  }
  for (const link of input.gearLinks) {
    if (link.commission) reasons.push(`the link ${quote(inlineText(link.label) || link.url.trim())} earns a commission`);
  }
  return { required: reasons.length > 0, reasons };
}

/**
 * The disclosure text the description will carry: the episode's own, else — only when one is
 * required — the channel's default; '' when none.
 */
export function resolveDisclosure(input: Pick<DescriptionInput, 'disclosure' | 'gear' | 'gearLinks' | 'settings'>): string {
  const own = blockText(input.disclosure);
  if (own !== '') return own;
  return disclosureRequired(input).required ? blockText(input.settings.defaultDisclosure) : '';
}

// ---------------------------------------------------------------------------------------------------
// Sections

function specsSection(tests: DescriptionInput['tests'], warnings: DescriptionWarning[]): string {
  const orderedTests = tests
    .map((test, index) => ({ test, index, name: inlineText(test.name) }))
    .sort((a, b) => a.test.order - b.test.order || compareText(a.name, b.name) || a.index - b.index);
  const groups: string[] = [];
  for (const { test, name } of orderedTests) {
    const lines = test.specLines
      .map((line, index) => ({ line, index }))
      .filter(({ line }) => line.inDescription)
      .sort((a, b) => a.line.order - b.line.order || compareText(a.line.key, b.line.key) || a.index - b.index);
    const printed: string[] = [];
    for (const { line } of lines) {
      const label = inlineText(line.label);
      const value = inlineText(line.value);
      if (value === '') {
        warnings.push({
          code: 'spec_line_empty',
          message: `${name}: ${quote(label)} is marked for the description but has no value, so it is left out`,
          fix: `Fill in ${label} on the ${name} spec sheet, or untick "in description"`,
        });
        continue;
      }
      printed.push(`- ${label}: ${value}`);
    }
    if (printed.length > 0) groups.push([name, ...printed].join('\n'));
  }
  return groups.length > 0 ? `Shooting specs\n\n${groups.join('\n\n')}` : '';
}

function chaptersSection(chapters: readonly Chapter[]): string {
  if (chapters.length === 0) return '';
  const lines = chapters.map((c) => `${secondsToChapterTime(c.startSeconds)} ${inlineText(c.label)}`);
  return ['Chapters', ...lines].join('\n');
}

function chapterWarnings(chapters: readonly Chapter[], durationSeconds: number | undefined): DescriptionWarning[] {
  // No chapters at all is a valid choice: the platform then simply shows none.
  if (chapters.length === 0) return [];
  const warnings: DescriptionWarning[] = [];
  const name = (i: number) =>
    `chapter ${i + 1} (${secondsToChapterTime(chapters[i].startSeconds)} ${inlineText(chapters[i].label)})`;

  if (chapters[0].startSeconds !== CHAPTER_FIRST_START_SECONDS) {
    warnings.push({
      code: 'chapter_first_not_zero',
      message: `The first chapter starts at ${secondsToChapterTime(chapters[0].startSeconds)}; the video platform shows chapters only when the first starts at 0:00`,
      fix: 'Add a chapter at 0:00 (for example "0:00 Intro") or move the first chapter to 0:00',
    });
  }
  if (chapters.length < CHAPTER_MIN_COUNT) {
    const more = CHAPTER_MIN_COUNT - chapters.length;
    warnings.push({
      code: 'chapter_too_few',
      message: `${plural(chapters.length, 'chapter', 'chapters')}; the video platform shows chapters only when there are at least ${CHAPTER_MIN_COUNT}`,
      fix: `Add at least ${plural(more, 'more chapter', 'more chapters')}, or remove the chapters`,
    });
  }
  for (let i = 1; i < chapters.length; i++) {
    const gap = chapters[i].startSeconds - chapters[i - 1].startSeconds;
    if (gap <= 0) {
      warnings.push({
        code: 'chapter_not_ascending',
        message: `${capitalise(name(i))} does not start after ${name(i - 1)}; chapters must be in time order`,
        fix: `Correct the start time of ${name(i)} or move it to its place in time order`,
      });
    } else if (gap < CHAPTER_MIN_SECONDS) {
      warnings.push({
        code: 'chapter_too_short',
        message: `${capitalise(name(i - 1))} lasts ${plural(gap, 'second', 'seconds')}; each chapter must last at least ${CHAPTER_MIN_SECONDS} seconds`,
        fix: `Start ${name(i)} at ${secondsToChapterTime(chapters[i - 1].startSeconds + CHAPTER_MIN_SECONDS)} or later, or merge the two chapters`,
      });
    }
  }
  if (durationSeconds !== undefined) {
    const last = chapters.length - 1;
    const remaining = durationSeconds - chapters[last].startSeconds;
    if (remaining < CHAPTER_MIN_SECONDS) {
      warnings.push({
        code: 'chapter_too_short',
        message:
          remaining <= 0
            ? `${capitalise(name(last))} starts after the video ends (${secondsToChapterTime(durationSeconds)})`
            : `${capitalise(name(last))} lasts ${plural(remaining, 'second', 'seconds')} before the video ends; each chapter must last at least ${CHAPTER_MIN_SECONDS} seconds`,
        fix: `Start the last chapter at ${secondsToChapterTime(Math.max(0, durationSeconds - CHAPTER_MIN_SECONDS))} or earlier, or remove it`,
      });
    }
  }
  return warnings;
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function linksSection(input: DescriptionInput, warnings: DescriptionWarning[]): string {
  const lines: string[] = [];
  for (const link of input.gearLinks) {
    const label = inlineText(link.label);
    const raw = inlineText(link.url);
    const checked = withTrackingParams(raw, input.settings.trackingParams);
    if (!checked.ok) {
      warnings.push({
        code: 'link_not_http',
        message: `The link ${quote(label || raw)} (${raw}) ${checked.reason}`,
        fix: 'Use a full web address starting with https://',
      });
    }
    const url = checked.ok ? checked.url : raw;
    lines.push(label ? `${label}: ${url}` : url);
  }
  return lines.length > 0 ? ['Gear links', ...lines].join('\n') : '';
}

// ---------------------------------------------------------------------------------------------------

/**
 * The description as plain text — summary, "Shooting specs" (lines marked "in description", per test,
 * in plan and spec-sheet order), chapters ("0:00 Label"), gear links with tracking parameters,
 * disclosure, sign-off; sections separated by one blank line, "\n" line ends, no trailing whitespace,
 * no final newline — and the warnings (title and description length, chapter rules, empty spec lines,
 * non-web links, missing disclosure).
 */
export function composeDescription(input: DescriptionInput): ComposedDescription {
  // Sections collect their own warnings; the list is then put in a fixed order: lengths first.
  const specWarnings: DescriptionWarning[] = [];
  const linkWarnings: DescriptionWarning[] = [];
  const specs = specsSection(input.tests, specWarnings);
  const links = linksSection(input, linkWarnings);
  const disclosure = resolveDisclosure(input);
  const sections = [
    blockText(input.summary),
    specs,
    chaptersSection(input.chapters),
    links,
    disclosure,
    blockText(input.signOff),
  ];
  const text = sections.filter((s) => s !== '').join(SECTION_SEPARATOR);

  const warnings: DescriptionWarning[] = [];
  const { titleMaxChars, descriptionMaxChars } = input.settings;
  const titleLength = descriptionLength(inlineText(input.title));
  if (titleLength > titleMaxChars) {
    warnings.push({
      code: 'title_too_long',
      message: `The title has ${titleLength} characters; the limit is ${titleMaxChars}`,
      fix: `Shorten the title by at least ${plural(titleLength - titleMaxChars, 'character', 'characters')}`,
    });
  }
  const length = descriptionLength(text);
  if (length > descriptionMaxChars) {
    warnings.push({
      code: 'description_too_long',
      message: `The description has ${length} characters; the limit is ${descriptionMaxChars}`,
      fix: `Cut at least ${plural(length - descriptionMaxChars, 'character', 'characters')}: shorten the summary or untick spec-sheet lines from the description`,
    });
  }
  warnings.push(...chapterWarnings(input.chapters, input.durationSeconds), ...specWarnings, ...linkWarnings);

  const need = disclosureRequired(input);
  if (need.required && disclosure === '') {
    warnings.push({
      code: 'disclosure_missing',
      message: `This description needs a disclosure: ${need.reasons.join('; ')}. ${DISCLOSURE_LEGAL_NOTE}`,
      fix: 'Write a disclosure for this episode, or set a default disclosure in the channel settings',
    });
  }
  return { text, warnings };
}
