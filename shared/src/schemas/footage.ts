// Footage and resumable uploads: what the upload server accepts, what the footage API returns.
import { z } from 'zod';
import { UuidSchema } from './common.ts';

/** What an uploaded file is. */
export const FOOTAGE_KINDS = ['camera_original', 'graded_render', 'frame_grab'] as const;
export const FootageKindSchema = z.enum(FOOTAGE_KINDS, { error: () => 'Choose what the file is: camera original, graded render or frame grab' });
export type FootageKind = z.infer<typeof FootageKindSchema>;
export const FOOTAGE_KIND_LABELS: Record<FootageKind, string> = {
  camera_original: 'Camera original',
  graded_render: 'Graded render',
  frame_grab: 'Frame grab',
};

/** Where a file is in its life: bytes arriving, all bytes here, checked and matching, checked with a problem. */
export const FOOTAGE_STATES = ['receiving', 'received', 'verified', 'flagged'] as const;
export const FootageStateSchema = z.enum(FOOTAGE_STATES);
export type FootageState = z.infer<typeof FootageStateSchema>;
export const FOOTAGE_STATE_LABELS: Record<FootageState, string> = { receiving: 'Receiving', received: 'Received', verified: 'Verified', flagged: 'Flagged' };

/** File formats the upload server recognises by their first bytes. */
export const FILE_FORMATS = ['isobmff', 'matroska', 'mxf', 'avi', 'png', 'jpeg', 'tiff', 'dpx'] as const;
export type FileFormat = (typeof FILE_FORMATS)[number];
export const FILE_FORMAT_LABELS: Record<FileFormat, string> = {
  isobmff: 'MP4 / MOV',
  matroska: 'Matroska / WebM',
  mxf: 'MXF',
  avi: 'AVI',
  png: 'PNG',
  jpeg: 'JPEG',
  tiff: 'TIFF',
  dpx: 'DPX',
};

/** File-name extensions (lower case, with the dot) each format is accepted under. */
export const FORMAT_EXTENSIONS: Record<FileFormat, readonly string[]> = {
  isobmff: ['.mp4', '.m4v', '.mov'],
  matroska: ['.mkv', '.webm'],
  mxf: ['.mxf'],
  avi: ['.avi'],
  png: ['.png'],
  jpeg: ['.jpg', '.jpeg'],
  tiff: ['.tif', '.tiff', '.dng'],
  dpx: ['.dpx'],
};

/** Formats accepted per kind: originals and renders are video (or image sequences' frames), grabs are stills. */
export const KIND_FORMATS: Record<FootageKind, readonly FileFormat[]> = {
  camera_original: ['isobmff', 'matroska', 'mxf', 'avi', 'dpx', 'tiff'],
  graded_render: ['isobmff', 'matroska', 'mxf', 'avi', 'dpx', 'tiff'],
  frame_grab: ['png', 'jpeg', 'tiff', 'dpx'],
};

/**
 * The kind a new file gets: `preferred` (the uploader's choice for the batch) when that kind accepts
 * the file's extension, else the first kind that does (a .png added as camera originals becomes a
 * frame grab); null when no kind accepts it.
 */
export function kindForFile(name: string, preferred: FootageKind): FootageKind | null {
  const ext = fileExtension(name);
  const accepts = (k: FootageKind) => extensionsForKind(k).includes(ext);
  if (accepts(preferred)) return preferred;
  return FOOTAGE_KINDS.find(accepts) ?? null;
}

/** Every extension some kind accepts, each once, in kind order. */
export function allFootageExtensions(): string[] {
  return [...new Set(FOOTAGE_KINDS.flatMap((k) => extensionsForKind(k)))];
}

/** Returns the extensions (".mov", …) a kind accepts. */
export function extensionsForKind(kind: FootageKind): string[] {
  return KIND_FORMATS[kind].flatMap((f) => FORMAT_EXTENSIONS[f]);
}

/** Returns the file name's extension in lower case with its dot ("" when none). */
export function fileExtension(name: string): string {
  const dot = name.lastIndexOf('.');
  return dot > 0 ? name.slice(dot).toLowerCase() : '';
}

/** Returns the format a file name claims by its extension, or null for an unknown extension. */
export function formatForFileName(name: string): FileFormat | null {
  const ext = fileExtension(name);
  if (!ext) return null;
  for (const f of FILE_FORMATS) if (FORMAT_EXTENSIONS[f].includes(ext)) return f;
  return null;
}

/** Default largest file, in bytes: 256 GiB (IEC 80000-13 binary prefix). */
export const UPLOAD_MAX_BYTES_DEFAULT = 256 * 1024 ** 3;

export const Sha256HexSchema = z
  .string()
  .trim()
  .toLowerCase()
  .regex(/^[0-9a-f]{64}$/, 'A SHA-256 is 64 hexadecimal characters');

/** The tus Upload-Metadata the footage uploader sends (keys as sent; values are strings). */
export const UploadMetadataSchema = z.object({
  episodeId: UuidSchema,
  kind: FootageKindSchema,
  stepId: z.union([UuidSchema, z.literal('')]).optional(),
  filename: z.string().min(1, 'The file has no name').max(1024),
  filetype: z.string().max(255).optional(),
  /** Empty when the browser's worker has not finished yet (the checksum then follows the upload). */
  sha256: z.union([Sha256HexSchema, z.literal('')]).optional(),
});
export type UploadMetadata = z.infer<typeof UploadMetadataSchema>;

/** What ffprobe found, reduced to the values Midgray shows and compares. */
export const ProbeSummarySchema = z.object({
  container: z.string().nullable(),
  codec: z.string().nullable(),
  codecLongName: z.string().nullable(),
  profile: z.string().nullable(),
  width: z.number().int().nullable(),
  height: z.number().int().nullable(),
  /** Exact rational as ffprobe reports it, e.g. "24000/1001". */
  frameRate: z.string().nullable(),
  fps: z.number().nullable(),
  bitDepth: z.number().int().nullable(),
  chromaSubsampling: z.string().nullable(),
  pixelFormat: z.string().nullable(),
  durationSeconds: z.number().nullable(),
  bitrateBitsPerSecond: z.number().nullable(),
  timecode: z.string().nullable(),
  audioStreams: z.number().int(),
});
export type ProbeSummary = z.infer<typeof ProbeSummarySchema>;

/** Spec-sheet keys a probe can be compared with. */
export const PROBE_COMPARED_KEYS = ['resolution', 'frame_rate', 'codec', 'bit_depth', 'chroma_subsampling', 'bitrate'] as const;
export type ProbeComparedKey = (typeof PROBE_COMPARED_KEYS)[number];

/** One value where the file differs from the spec sheet, with the difference spelt out. */
export const SpecMismatchSchema = z.object({
  key: z.enum(PROBE_COMPARED_KEYS),
  label: z.string(),
  expected: z.string(),
  actual: z.string(),
  difference: z.string(),
});
export type SpecMismatch = z.infer<typeof SpecMismatchSchema>;

/** A spec-sheet line that was not compared, and why. */
export const SpecSkipSchema = z.object({ key: z.enum(PROBE_COMPARED_KEYS), label: z.string(), reason: z.string() });
export type SpecSkip = z.infer<typeof SpecSkipSchema>;

export const FootagePersonSchema = z.object({ id: UuidSchema, name: z.string() });
export type FootagePerson = z.infer<typeof FootagePersonSchema>;

/** One footage row as the API returns it. */
export const FootageSchema = z.object({
  id: UuidSchema,
  episodeId: UuidSchema,
  stepId: UuidSchema.nullable(),
  stepLabel: z.string().nullable(),
  kind: FootageKindSchema,
  status: FootageStateSchema,
  originalName: z.string(),
  format: z.string(),
  sizeBytes: z.number(),
  /** Bytes on the server so far while `receiving` (the upload's offset); equals sizeBytes afterwards. */
  receivedBytes: z.number(),
  /** When an unfinished upload is removed; null once received. */
  uploadExpiresAt: z.string().nullable(),
  clientSha256: z.string().nullable(),
  serverSha256: z.string().nullable(),
  probe: ProbeSummarySchema.nullable(),
  probeError: z.string().nullable(),
  /** null until compared; [] when everything compared matched. */
  specMismatches: z.array(SpecMismatchSchema).nullable(),
  specSkipped: z.array(SpecSkipSchema),
  /** Name of the test whose spec sheet the file was compared with. */
  specTestName: z.string().nullable(),
  hasThumbnail: z.boolean(),
  uploader: FootagePersonSchema.nullable(),
  holder: FootagePersonSchema.nullable(),
  heldSince: z.string().nullable(),
  checkedAt: z.string().nullable(),
  createdAt: z.string(),
  version: z.number().int(),
});
export type Footage = z.infer<typeof FootageSchema>;

/** A test step footage can be tied to, labelled for a picker. */
export const FootageStepOptionSchema = z.object({ id: UuidSchema, label: z.string(), testName: z.string() });
export type FootageStepOption = z.infer<typeof FootageStepOptionSchema>;

/** GET /api/episodes/:id/footage */
export const FootageListSchema = z.object({
  footage: z.array(FootageSchema),
  steps: z.array(FootageStepOptionSchema),
  /** Largest file the server accepts, in bytes. */
  maxFileBytes: z.number(),
});
export type FootageList = z.infer<typeof FootageListSchema>;

export const UploadParamsSchema = z.strictObject({ uploadId: z.string().regex(/^[0-9a-f]{32}$/, 'Not an upload id') });

export const ClientChecksumInputSchema = z.strictObject({ sha256: Sha256HexSchema });
export type ClientChecksumInput = z.infer<typeof ClientChecksumInputSchema>;

export const FootageVersionInputSchema = z.strictObject({ version: z.number().int().min(1) });
export type FootageVersionInput = z.infer<typeof FootageVersionInputSchema>;

export const ReassignFootageInputSchema = z.strictObject({ version: z.number().int().min(1), userId: UuidSchema });
export type ReassignFootageInput = z.infer<typeof ReassignFootageInputSchema>;
