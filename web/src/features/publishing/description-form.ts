// The Description tab's form values and their conversion to the shared `DescriptionParts`.
// Chapter times are typed as text ("1:30"), so the form keeps them as text and converts on the way
// out; a time that does not parse stays in the form with its error and is left out of the preview.
import { z } from 'zod';
import { fileSlug } from '@midgray/shared';
import {
  CHAPTER_LABEL_MAX,
  DescriptionGearLinkSchema,
  DESCRIPTION_DISCLOSURE_MAX,
  DESCRIPTION_SUMMARY_MAX,
  GEAR_LINKS_MAX,
  CHAPTERS_MAX,
  chapterTimeToSeconds,
  secondsToChapterTime,
  type DescriptionParts,
} from '@midgray/shared';

const ChapterRowSchema = z.object({
  time: z.string().refine((t) => 'seconds' in chapterTimeToSeconds(t), { message: 'Write the start like 0:00, 12:30 or 1:02:03' }),
  label: z.string().trim().min(1, 'Give the chapter a label').max(CHAPTER_LABEL_MAX),
});

/** What the form holds; validated with the same limits as the API's DescriptionPartsSchema. */
export const DescriptionFormSchema = z.object({
  summary: z.string().max(DESCRIPTION_SUMMARY_MAX),
  chapters: z.array(ChapterRowSchema).max(CHAPTERS_MAX),
  gearLinks: z.array(DescriptionGearLinkSchema.extend({ url: z.string().trim().min(1, 'Enter the link’s address') })).max(GEAR_LINKS_MAX),
  disclosure: z.string().max(DESCRIPTION_DISCLOSURE_MAX),
});
export type DescriptionForm = z.infer<typeof DescriptionFormSchema>;

/** Form values from saved parts. */
export function formFromParts(p: DescriptionParts): DescriptionForm {
  return {
    summary: p.summary,
    chapters: p.chapters.map((c) => ({ time: secondsToChapterTime(c.startSeconds), label: c.label })),
    gearLinks: p.gearLinks.map((l) => ({ ...l })),
    disclosure: p.disclosure,
  };
}

/** Parts from form values; chapters whose time does not parse or that have no label are left out. */
export function partsFromForm(f: DescriptionForm): DescriptionParts {
  const chapters: DescriptionParts['chapters'] = [];
  for (const c of f.chapters ?? []) {
    const t = chapterTimeToSeconds(c?.time ?? '');
    if ('seconds' in t && (c?.label ?? '').trim() !== '') chapters.push({ label: c.label.trim(), startSeconds: t.seconds });
  }
  return {
    summary: f.summary ?? '',
    chapters,
    gearLinks: (f.gearLinks ?? []).filter((l) => (l?.url ?? '').trim() !== '').map((l) => ({ url: l.url, label: l.label ?? '', commission: !!l.commission })),
    disclosure: f.disclosure ?? '',
  };
}

/** "lumen-k9-noise.txt" from an episode title. */
export function textFileName(title: string): string {
  const slug = fileSlug(title);
  return `${slug || 'description'}.txt`;
}
