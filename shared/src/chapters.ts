/**
 * Chapters of the description: times as "m:ss" / "h:mm:ss", pasted-text parsing and the video
 * platform's chapter rules. Re-exported by description.ts.
 *
 * The names avoid `parseChapterTime` / `formatChapterTime`, which timecode.ts owns.
 */
import { capitalise, inlineText, plural, quote } from './plain-text.ts';
import {
  CHAPTER_FIRST_START_SECONDS,
  CHAPTER_MIN_COUNT,
  CHAPTER_MIN_SECONDS,
  type Chapter,
  type DescriptionWarning,
} from './schemas/description.ts';

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

// Optional list marker, a time (optionally in brackets), an optional separator, the label. The
// lookahead keeps "12:30ISO" or "1:02:03:04" from passing as a time followed by a label.
const CHAPTER_LINE = /^(?:[-*•]\s+)?[[(]?(\d+(?::\d+){1,2})[\])]?(?=\s|$|[-–—|]|:(?!\d))\s*(?:[-–—:|]\s*)?(.*)$/u;

/**
 * Chapters from pasted text, one per line: "0:00 Intro", "1:02:03 - Latitude test", "12:30 ISO sweep".
 * Blank lines and a "Chapters" heading are skipped; every other line becomes either a chapter (in
 * the pasted order, so the chapter checks can point at one out of order) or an error naming the line.
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

/**
 * Warnings for the video platform's chapter rules (`from memory`): first chapter at 0:00, at least
 * three, ascending, each at least ten seconds long (the last one too, when the video length is known).
 */
export function checkChapters(chapters: readonly Chapter[], durationSeconds?: number): DescriptionWarning[] {
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
