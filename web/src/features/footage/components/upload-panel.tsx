// The upload area: what the files are and which test step they belong to, then an Uppy dashboard
// that sends them over tus to /api/uploads (progress, pause and resume; a file added again after a
// reload resumes from the server's offset), with each file's own speed and time left listed below.
// Each file's SHA-256 is computed in a web worker meanwhile and sent with the upload, or right after
// it when hashing finishes later.
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import './upload-panel.css';
import { useQueryClient } from '@tanstack/react-query';
import Uppy, { type UppyFile } from '@uppy/core';
import Dashboard from '@uppy/react/dashboard';
import Tus from '@uppy/tus';
import { useEffect, useRef, useState } from 'react';
import { allFootageExtensions, extensionsForKind, FOOTAGE_KIND_LABELS, FOOTAGE_KINDS, kindForFile, type FootageKind, type FootageStepOption } from '@midgray/shared';
import { SelectField } from '../../../components/ui/field.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { getCsrfToken } from '../../../lib/api-client.ts';
import { footageListQueryOptions, sendClientChecksum } from '../api/footage.ts';
import { sha256OfFile } from '../hash/sha256.ts';
import { useTransfers } from '../hooks/use-transfers.ts';
import { formatBytes } from './format.ts';
import { TransferList } from './transfer-list.tsx';

type FileMeta = { episodeId?: string; kind?: FootageKind; stepId?: string; sha256?: string; name?: string; type?: string };
type FootageUppy = Uppy<FileMeta, Record<string, never>>;

interface Checksum {
  name: string;
  size: number;
  bytes: number;
  sha256?: string;
  error?: string;
  /** Upload id once the upload finished, so a late checksum can follow it. */
  uploadId?: string;
  sent?: boolean;
}

type MetaFieldProps = { value: string; onChange: (v: string) => void; form: string };
type Hyperscript = (node: unknown, params: Record<string, unknown> | null, ...children: unknown[]) => unknown;

/** A select for one field of the upload widget's per-file edit card (its label points at this id). */
const metaSelect =
  (field: string, options: [value: string, label: string][]) =>
  ({ value, onChange, form }: MetaFieldProps, h: Hyperscript) =>
    h(
      'select',
      { id: `uppy-Dashboard-FileCard-input-${field}`, form, value, class: 'uppy-c-textInput uppy-Dashboard-FileCard-input', onChange: (e: Event) => onChange((e.target as HTMLSelectElement).value) },
      ...options.map(([v, label]) => h('option', { value: v, key: v }, label)),
    );

/** Reads the person-facing message from a tus error: the API's JSON message or the server's text. */
export function uploadErrorMessage(error: unknown): string {
  const res = (error as { originalResponse?: { getBody?: () => string; getStatus?: () => number } })?.originalResponse;
  const body = res?.getBody?.();
  if (body) {
    try {
      const parsed = JSON.parse(body) as { error?: { message?: string } };
      if (parsed.error?.message) return parsed.error.message;
    } catch {
      /* plain text from the upload server */
    }
    return body.trim();
  }
  if (typeof navigator !== 'undefined' && !navigator.onLine) return 'You are offline: add the file again when you are back online and it continues where it stopped';
  return 'The upload stopped: check your connection and add the file again to continue where it stopped';
}

export function UploadPanel({ episodeId, steps, maxFileBytes }: { episodeId: string; steps: FootageStepOption[]; maxFileBytes: number }) {
  const qc = useQueryClient();
  const [kind, setKind] = useState<FootageKind>('camera_original');
  const [stepId, setStepId] = useState('');
  const [uppy, setUppy] = useState<FootageUppy | null>(null);
  // The batch choice as the event handlers read it (they are made once per episode).
  const choice = useRef({ kind, stepId });
  choice.current = { kind, stepId };
  // Files whose kind or step someone set on the file itself: the batch choice no longer changes them.
  const editedOnFile = useRef(new Set<string>());
  const [sums, setSums] = useState<Record<string, Checksum>>({});
  // The checksums as events change them (React state only mirrors this for display, so a late
  // event never reads a state that has not re-rendered yet).
  const live = useRef(new Map<string, Checksum>());

  useEffect(() => {
    const u: FootageUppy = new Uppy<FileMeta, Record<string, never>>({
      id: `footage-${episodeId}`,
      autoProceed: false,
      // Any kind's files are accepted; each new file takes the batch's kind when that kind accepts it (kindForFile).
      restrictions: { maxFileSize: maxFileBytes, allowedFileTypes: allFootageExtensions() },
      meta: { episodeId, kind: 'camera_original', stepId: '', sha256: '' },
      // Refusals are shown in the dashboard (see upload-error below); log them as warnings, not errors.
      logger: { debug: () => undefined, warn: (...args: unknown[]) => console.warn(...args), error: (...args: unknown[]) => console.warn(...args) },
    }).use(Tus, {
      endpoint: '/api/uploads',
      // chunkSize left unset: one request per file, resumed from the server's offset when it breaks.
      retryDelays: [0, 1000, 3000, 5000, 10_000],
      removeFingerprintOnSuccess: true,
      allowedMetaFields: ['episodeId', 'kind', 'stepId', 'name', 'type', 'sha256'],
      onBeforeRequest: async (req) => {
        req.setHeader('X-CSRF-Token', await getCsrfToken());
      },
    });
    const hashes = new Map<string, () => void>();
    const show = () => setSums(Object.fromEntries(live.current));
    const update = (id: string, patch: Partial<Checksum>) => {
      const c = live.current.get(id);
      if (!c) return;
      live.current.set(id, { ...c, ...patch });
      show();
    };
    const sendIfReady = (id: string) => {
      const c = live.current.get(id);
      if (!c?.sha256 || !c.uploadId || c.sent) return;
      update(id, { sent: true });
      sendClientChecksum(c.uploadId, c.sha256)
        .then(() => qc.invalidateQueries({ queryKey: footageListQueryOptions(episodeId).queryKey }))
        .catch((err: Error) => update(id, { error: `Could not send the checksum: ${err.message}` }));
    };
    u.on('file-added', (file: UppyFile<FileMeta, Record<string, never>>) => {
      u.setFileMeta(file.id, { kind: kindForFile(file.name ?? '', choice.current.kind) ?? choice.current.kind, stepId: choice.current.stepId });
      live.current.set(file.id, { name: file.name ?? 'file', size: file.size ?? 0, bytes: 0 });
      show();
      if (!(file.data instanceof File)) return;
      const job = sha256OfFile(file.data, (bytes) => update(file.id, { bytes }));
      hashes.set(file.id, job.cancel);
      job.promise.then(
        (sha256) => {
          update(file.id, { sha256, bytes: file.size ?? 0 });
          // Not started yet: the checksum travels with the upload's metadata.
          const current = u.getFile(file.id);
          if (current && !current.progress.uploadStarted) u.setFileMeta(file.id, { sha256 });
          sendIfReady(file.id);
        },
        (err: Error) => update(file.id, { error: err.message }),
      );
    });
    u.on('dashboard:file-edit-complete', (file) => {
      if (file) editedOnFile.current.add(file.id);
    });
    u.on('file-removed', (file) => {
      editedOnFile.current.delete(file.id);
      hashes.get(file.id)?.();
      live.current.delete(file.id);
      show();
    });
    // While this browser uploads, refresh the table now and then so the row shows how far it got.
    let lastRefresh = 0;
    const refresh = () => void qc.invalidateQueries({ queryKey: footageListQueryOptions(episodeId).queryKey });
    u.on('upload', () => setTimeout(refresh, 800));
    u.on('upload-progress', () => {
      if (Date.now() - lastRefresh < 2500) return;
      lastRefresh = Date.now();
      refresh();
    });
    u.on('upload-success', (file, response) => {
      if (!file) return;
      const uploadId = response.uploadURL?.split('/').pop();
      if (uploadId) {
        update(file.id, { uploadId });
        sendIfReady(file.id);
      }
      void qc.invalidateQueries({ queryKey: footageListQueryOptions(episodeId).queryKey });
    });
    u.on('upload-error', (file, error) => {
      const message = uploadErrorMessage(error);
      if (file) u.setFileState(file.id, { error: message });
      u.info(message, 'error', 10_000);
      void qc.invalidateQueries({ queryKey: footageListQueryOptions(episodeId).queryKey });
    });
    setUppy(u);
    return () => {
      for (const cancel of hashes.values()) cancel();
      u.destroy();
    };
  }, [episodeId, maxFileBytes, qc]);

  // The batch's kind and step apply to files added from now on and to files not started yet,
  // except files whose own kind or step was set on the file (its edit button in the dashboard).
  useEffect(() => {
    if (!uppy) return;
    uppy.setMeta({ kind, stepId });
    for (const f of uppy.getFiles()) {
      if (f.progress.uploadStarted || editedOnFile.current.has(f.id)) continue;
      uppy.setFileMeta(f.id, { kind: kindForFile(f.name ?? '', kind) ?? kind, stepId });
    }
  }, [uppy, kind, stepId]);

  // Per file, in the dashboard's edit card: what the file is and its test step.
  const stepChoices: [string, string][] = [['', 'No particular step'], ...steps.map((st): [string, string] => [st.id, `${st.testName} · ${st.label}`])];
  const metaFields = [
    { id: 'kind', name: 'What the file is', render: metaSelect('kind', FOOTAGE_KINDS.map((k) => [k, FOOTAGE_KIND_LABELS[k]])) },
    { id: 'stepId', name: 'Test step', render: metaSelect('stepId', stepChoices) },
  ];

  // With a single file the upload widget draws its file as a list item outside any list (a
  // role="list" is missing on that path of its own markup); give the container the role it lacks.
  const dashboardBox = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const box = dashboardBox.current;
    if (!box) return;
    const mend = () => box.querySelectorAll('.uppy-Dashboard-files:not([role])').forEach((el) => el.setAttribute('role', 'list'));
    mend();
    const watch = new MutationObserver(mend);
    watch.observe(box, { childList: true, subtree: true });
    return () => watch.disconnect();
  }, [uppy]);

  const { transfers, announcement } = useTransfers(uppy);
  const checksumRows = Object.entries(sums);
  return (
    <Panel title="Upload footage">
      <div className="mb-3 grid gap-3 sm:grid-cols-2">
        <SelectField label="What are these files?" value={kind} onChange={(e) => setKind(e.target.value as FootageKind)} hint={`${extensionsForKind(kind).join(' ')}; a still image added here goes in as a frame grab. Change one file with its edit button.`}>
          {FOOTAGE_KINDS.map((k) => (
            <option key={k} value={k}>
              {FOOTAGE_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Test step (optional)" value={stepId} onChange={(e) => setStepId(e.target.value)} hint={steps.length ? 'The probe compares the file with this test’s spec sheet' : 'This episode has no test steps yet'}>
          {stepChoices.map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </SelectField>
      </div>
      <div ref={dashboardBox}>
        {uppy && (
          <Dashboard
            uppy={uppy}
            width="100%"
            height={400}
            // Each file's own speed and time left are listed below; the widget's overall estimate would disagree with them.
            hideProgressDetails
            metaFields={metaFields as never}
            proudlyDisplayPoweredByUppy={false}
            note={`Up to ${formatBytes(maxFileBytes)} per file. Interrupted? Add the same file again: it continues where it stopped.`}
          />
        )}
      </div>
      <TransferList transfers={transfers} announcement={announcement} />
      {checksumRows.length > 0 && (
        <div className="mt-3" aria-label="Checksums">
          <h3 className="text-sm font-semibold">SHA-256 computed in your browser</h3>
          <ul className="mt-1 space-y-1 text-xs text-ink-soft">
            {checksumRows.map(([id, c]) => (
              <li key={id} className="flex flex-wrap items-baseline gap-x-2">
                <span className="font-medium text-ink">{c.name}</span>
                {c.error ? (
                  <span className="text-danger">{c.error}</span>
                ) : c.sha256 ? (
                  <code className="break-all font-mono">{c.sha256}</code>
                ) : (
                  <span>{c.size ? Math.floor((100 * c.bytes) / c.size) : 0} % read</span>
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
    </Panel>
  );
}
