/**
 * The description composer (issue #7): turns the parts a team edits — summary, spec-sheet lines,
 * chapters, links, disclosure, sign-off — into the plain text pasted into the video platform, plus
 * warnings a person can act on.
 *
 * Pure and deterministic: web (live preview) and api (stored version, approval checks) must produce
 * byte-identical text, so nothing here depends on locale, time or environment — ties are broken by
 * code-unit comparison, never `localeCompare`, and numbers are printed without locale formatting.
 */
import { checkChapters, secondsToChapterTime } from './chapters.ts';
import { blockText, compareText, descriptionLength, inlineText, plural, quote } from './plain-text.ts';
import {
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

export {
  checkChapters,
  chapterTimeToSeconds,
  parseChapters,
  secondsToChapterTime,
  type ChapterParseError,
} from './chapters.ts';
export { descriptionLength } from './plain-text.ts';

const SECTION_SEPARATOR = '\n\n';

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
export function resolveDisclosure(
  input: Pick<DescriptionInput, 'disclosure' | 'gear' | 'gearLinks' | 'settings'>,
): string {
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
      fix:
        `Cut at least ${plural(length - descriptionMaxChars, 'character', 'characters')}: ` +
        'shorten the summary or untick spec-sheet lines from the description',
    });
  }
  warnings.push(...checkChapters(input.chapters, input.durationSeconds), ...specWarnings, ...linkWarnings);

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
