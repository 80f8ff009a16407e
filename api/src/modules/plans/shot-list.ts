// The shot list as CSV: one record per step of every test of an episode, planned settings
// beside empty "as shot" columns for the set, filled in where a step is already shot.
import { TEST_KIND_LABELS, formatAngle, formatDensity, formatFNumber, formatSeconds, formatStops, type TestDto, fileSlug } from '@midgray/shared';
import { guardFormula, toCsv, type CsvCell } from '../../lib/csv.ts';

export const SHOT_LIST_COLUMNS = [
  'Test',
  'Kind',
  'Step',
  'Label',
  'ISO',
  'Offset (stops)',
  'ND',
  'Aperture',
  'Shutter angle',
  'Shutter time',
  'Light change (stops)',
  'Seconds',
  'Grade correction',
  'Warning',
  'Shot',
  'Actual ISO',
  'Actual aperture',
  'Actual shutter angle',
  'Actual ND',
  'Rating',
  'Observation',
] as const;

const orEmpty = <T,>(v: T | null | undefined, f: (v: T) => string) => (v === null || v === undefined ? '' : f(v));

/** Returns the CSV text (RFC 4180, UTF-8 with a byte-order mark so spreadsheets pick the encoding) of the episode's shot list. */
export function shotListCsv(tests: TestDto[]): string {
  const rows: CsvCell[][] = [[...SHOT_LIST_COLUMNS]];
  for (const t of tests) {
    for (const s of t.steps) {
      const p = s.planned;
      rows.push([
        guardFormula(t.name),
        TEST_KIND_LABELS[t.kind],
        s.index + 1,
        guardFormula(s.label),
        orEmpty(p.iso, String),
        orEmpty(s.offsetStops, formatStops),
        orEmpty(p.ndDensity, formatDensity),
        orEmpty(p.fNumber, formatFNumber),
        orEmpty(p.shutterAngleDeg, formatAngle),
        orEmpty(p.shutterSeconds, formatSeconds),
        orEmpty(p.lightChangeStops, formatStops),
        s.plannedSeconds,
        p.gradeCorrectionLabel ?? '',
        p.warning ?? '',
        s.shotAt ? 'yes' : '',
        orEmpty(s.actual?.iso, String),
        orEmpty(s.actual?.fNumber, formatFNumber),
        orEmpty(s.actual?.shutterAngleDeg, formatAngle),
        orEmpty(s.actual?.ndDensity, formatDensity),
        orEmpty(s.rating, String),
        guardFormula(s.observation),
      ]);
    }
  }
  return '\uFEFF' + toCsv(rows);
}

/** Returns a file name for the episode's shot list: letters, digits and dashes only. */
export function shotListFileName(title: string): string {
  const slug = fileSlug(title);
  return `shot-list-${slug || 'episode'}.csv`;
}
