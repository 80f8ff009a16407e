import { describe, expect, it } from 'vitest';
import { DescriptionFormSchema, formFromParts, partsFromForm, textFileName } from './description-form.ts';

describe('the description form', () => {
  it('turns saved parts into form rows and back without loss', () => {
    const parts = {
      summary: 'A test.',
      chapters: [
        { label: 'Intro', startSeconds: 0 },
        { label: 'Latitude', startSeconds: 3723 },
      ],
      gearLinks: [{ url: 'https://shop.example/k9', label: 'K9', commission: true }],
      disclosure: 'Loaned.',
    };
    const form = formFromParts(parts);
    expect(form.chapters).toEqual([
      { time: '0:00', label: 'Intro' },
      { time: '1:02:03', label: 'Latitude' },
    ]);
    expect(partsFromForm(form)).toEqual(parts);
  });

  it('leaves rows with a bad time, no label or no address out of the preview, and the schema names the problem', () => {
    const form = {
      summary: '',
      chapters: [
        { time: '0:00', label: 'Intro' },
        { time: '1:5', label: 'Bad time' },
        { time: '2:00', label: '  ' },
      ],
      gearLinks: [{ url: ' ', label: 'Empty', commission: false }],
      disclosure: '',
    };
    expect(partsFromForm(form)).toEqual({ summary: '', chapters: [{ label: 'Intro', startSeconds: 0 }], gearLinks: [], disclosure: '' });
    const checked = DescriptionFormSchema.safeParse(form);
    expect(checked.success).toBe(false);
    const messages = checked.success ? [] : checked.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    expect(messages).toEqual([
      'chapters.1.time: Write the start like 0:00, 12:30 or 1:02:03',
      'chapters.2.label: Give the chapter a label',
      'gearLinks.0.url: Enter the link’s address',
    ]);
  });

  it('names the download after the title, in plain lower-case ASCII', () => {
    expect(textFileName('Korvala K9 Cine: how far can exposure be pulled back?')).toBe('korvala-k9-cine-how-far-can-exposure-be-pulled-back.txt');
    expect(textFileName('Réglage café')).toBe('reglage-cafe.txt');
    expect(textFileName('???')).toBe('description.txt');
  });
});
