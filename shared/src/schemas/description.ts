import { z } from 'zod';
import { ChannelSettingsSchema } from './channels.ts';

/*
 * Publishing limits of the video platform. All `from memory`, not checked against the platform's
 * help pages; channels can override the two length limits in their settings (issue #7).
 */
/** Default description limit, in characters (Unicode code points) — `from memory`. */
export const DESCRIPTION_MAX_CHARS_DEFAULT = 5000;
/** Default title limit, in characters (Unicode code points) — `from memory`. */
export const TITLE_MAX_CHARS_DEFAULT = 100;
/** Chapters are shown only when the first one starts here, in seconds — `from memory`. */
export const CHAPTER_FIRST_START_SECONDS = 0;
/** Chapters are shown only when there are at least this many — `from memory`. */
export const CHAPTER_MIN_COUNT = 3;
/** Each chapter must last at least this long, in seconds — `from memory`. */
export const CHAPTER_MIN_SECONDS = 10;

/*
 * Our own field limits (storage and form sanity), deliberately above the platform limits so an
 * over-long title or description reaches the composer and gets a warning instead of a 400.
 */
export const DESCRIPTION_TITLE_FIELD_MAX = 1000;
export const DESCRIPTION_SUMMARY_MAX = 20_000;
export const DESCRIPTION_DISCLOSURE_MAX = 2000;
export const DESCRIPTION_SIGN_OFF_MAX = 2000;
export const SPEC_LINE_VALUE_MAX = 500;
export const CHAPTER_LABEL_MAX = 200;
/** 99:59:59 — longer than any episode we expect, in seconds. */
export const CHAPTER_START_MAX_SECONDS = 359_999;
export const CHAPTERS_MAX = 200;
export const CHAPTERS_PASTE_MAX = 20_000;
export const GEAR_LINK_URL_MAX = 2048;
export const GEAR_LINKS_MAX = 50;

/** One spec-sheet line as the composer sees it; `order` is the line's place on the spec sheet. */
export const DescriptionSpecLineSchema = z.object({
  key: z.string().min(1).max(64),
  label: z.string().min(1).max(120),
  value: z.string().max(SPEC_LINE_VALUE_MAX),
  inDescription: z.boolean(),
  order: z.number().int(),
});
export type DescriptionSpecLine = z.infer<typeof DescriptionSpecLineSchema>;

/** A test of the episode with its spec sheet; `order` is the test's place in the plan. */
export const DescriptionTestSchema = z.object({
  name: z.string().min(1).max(200),
  order: z.number().int(),
  specLines: z.array(DescriptionSpecLineSchema).max(100),
});
export type DescriptionTest = z.infer<typeof DescriptionTestSchema>;

/** A chapter: label and start time in whole seconds from the start of the video. */
export const ChapterSchema = z.object({
  label: z.string().trim().min(1, 'Give the chapter a label').max(CHAPTER_LABEL_MAX),
  startSeconds: z.number().int().min(0).max(CHAPTER_START_MAX_SECONDS),
});
export type Chapter = z.infer<typeof ChapterSchema>;

export const ChaptersSchema = z.array(ChapterSchema).max(CHAPTERS_MAX);

/** Pasted chapter lines ("0:00 Intro" one per line), as sent to the chapter parser. */
export const PastedChaptersSchema = z.string().max(CHAPTERS_PASTE_MAX);

/** A link in the description; `commission` when the channel earns from purchases through it. */
export const DescriptionGearLinkSchema = z.object({
  // Not z.url(): a non-web link must reach the composer so it can explain the problem as a warning.
  url: z.string().trim().min(1).max(GEAR_LINK_URL_MAX),
  label: z.string().max(200),
  commission: z.boolean(),
});
export type DescriptionGearLink = z.infer<typeof DescriptionGearLinkSchema>;

/** Gear of the episode, reduced to what decides whether a disclosure is required. */
export const DescriptionGearSchema = z.object({
  name: z.string().min(1).max(200),
  source: z.enum(['loaner', 'rental', 'owned', 'purchased']),
  sponsored: z.boolean(),
});
export type DescriptionGear = z.infer<typeof DescriptionGearSchema>;

/** The channel settings the composer reads; same fields and defaults as the channel's settings. */
export const DescriptionSettingsSchema = ChannelSettingsSchema.pick({
  descriptionMaxChars: true,
  titleMaxChars: true,
  trackingParams: true,
  defaultDisclosure: true,
});
export type DescriptionSettings = z.infer<typeof DescriptionSettingsSchema>;

/** Everything `composeDescription` needs. */
export const DescriptionInputSchema = z.object({
  title: z.string().max(DESCRIPTION_TITLE_FIELD_MAX),
  summary: z.string().max(DESCRIPTION_SUMMARY_MAX),
  tests: z.array(DescriptionTestSchema).max(50),
  chapters: ChaptersSchema,
  gearLinks: z.array(DescriptionGearLinkSchema).max(GEAR_LINKS_MAX),
  gear: z.array(DescriptionGearSchema).max(100),
  /** The episode's own disclosure; when blank and one is required, the channel default is used. */
  disclosure: z.string().max(DESCRIPTION_DISCLOSURE_MAX),
  signOff: z.string().max(DESCRIPTION_SIGN_OFF_MAX),
  /** Length of the finished video, in seconds, when known: lets the last chapter be checked too. */
  durationSeconds: z.number().int().positive().optional(),
  settings: DescriptionSettingsSchema,
});
export type DescriptionInput = z.infer<typeof DescriptionInputSchema>;

export const DESCRIPTION_WARNING_CODES = [
  'title_too_long',
  'description_too_long',
  'chapter_first_not_zero',
  'chapter_too_few',
  'chapter_not_ascending',
  'chapter_too_short',
  'spec_line_empty',
  'link_not_http',
  'disclosure_missing',
] as const;

/** A problem with the description a person can act on: what is wrong and how to fix it. */
export const DescriptionWarningSchema = z.object({
  code: z.enum(DESCRIPTION_WARNING_CODES),
  message: z.string(),
  fix: z.string(),
});
export type DescriptionWarning = z.infer<typeof DescriptionWarningSchema>;

/** The composer's result: plain text ("\n" line ends) and the warnings shown beside the preview. */
export const ComposedDescriptionSchema = z.object({
  text: z.string(),
  warnings: z.array(DescriptionWarningSchema),
});
export type ComposedDescription = z.infer<typeof ComposedDescriptionSchema>;
