// The Description tab composes live with the shared composer: typing in the summary changes the
// preview and its character count; a loaned item without a disclosure shows the warning with its fix
// and the legal note; a version conflict on save keeps the edits and offers to load the saved text.
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { composeDescription, descriptionInputFrom, DISCLOSURE_LEGAL_NOTE, type EpisodeDescription } from '@midgray/shared';
import { ToastProvider } from '../../../components/ui/toast.tsx';
import { descriptionQueryOptions, descriptionVersionsQueryOptions } from '../api/description.ts';
import DescriptionTab from './description-tab.tsx';

const EPISODE = '00000000-0000-4000-8000-000000000007';

function loaded(over: Partial<EpisodeDescription['context']> = {}): EpisodeDescription {
  const context: EpisodeDescription['context'] = {
    title: 'K9 Cine noise',
    tests: [],
    gear: [{ name: 'Korvala K9 Cine', source: 'loaner', sponsored: false }],
    signOff: 'Bench crew.',
    settings: { descriptionMaxChars: 60, titleMaxChars: 100, trackingParams: [], defaultDisclosure: '' },
    ...over,
  };
  const parts = { summary: 'Noise test.', chapters: [], gearLinks: [], disclosure: '' };
  return {
    episodeId: EPISODE,
    version: 1,
    parts,
    context,
    composed: composeDescription(descriptionInputFrom(context, parts)),
    disclosure: { required: true, reasons: ['Korvala K9 Cine is a loaner'], present: false },
    updatedAt: '2026-12-01T10:00:00.000Z',
    updatedBy: { id: '00000000-0000-4000-8000-000000000009', name: 'Dario Fenwick' },
    canEdit: true,
  };
}

function renderTab(data: EpisodeDescription) {
  const qc = new QueryClient({ defaultOptions: { queries: { staleTime: Infinity, retry: false } } });
  qc.setQueryData(descriptionQueryOptions(EPISODE).queryKey, data);
  qc.setQueryData(descriptionVersionsQueryOptions(EPISODE).queryKey, []);
  return render(
    <QueryClientProvider client={qc}>
      <ToastProvider>
        <DescriptionTab episodeId={EPISODE} channelId="00000000-0000-4000-8000-000000000001" />
      </ToastProvider>
    </QueryClientProvider>,
  );
}

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('DescriptionTab', () => {
  it('composes the preview live as the summary is typed, with the character count against the limit', async () => {
    renderTab(loaded());
    const preview = () => screen.getByLabelText('Composed description').textContent;
    expect(preview()).toBe('Noise test.\n\nBench crew.');
    expect(screen.getByText('24 of 60 characters')).toBeTruthy();
    await act(async () => {
      fireEvent.change(screen.getByLabelText(/What the video is about/), { target: { value: 'A much longer summary of the noise test on the K9.' } });
    });
    expect(preview()).toBe('A much longer summary of the noise test on the K9.\n\nBench crew.');
    // 50 + 2 + 11 = 63 characters: over the channel's (test) limit of 60.
    expect(screen.getByText('63 of 60 characters — 3 over the limit')).toBeTruthy();
    expect(screen.getByText(/The description has 63 characters; the limit is 60/)).toBeTruthy();
    expect(screen.getByText('unsaved changes')).toBeTruthy();
  });

  it('shows the missing disclosure with its fix and the legal note, and clears it once a disclosure is written', async () => {
    renderTab(loaded({ settings: { descriptionMaxChars: 5000, titleMaxChars: 100, trackingParams: [], defaultDisclosure: '' } }));
    const warnings = screen.getByRole('list', { name: 'Warnings' });
    expect(within(warnings).getByText(/This description needs a disclosure: Korvala K9 Cine is a loaner/)).toBeTruthy();
    expect(within(warnings).getByText(/Write a disclosure for this episode/)).toBeTruthy();
    expect(screen.getAllByText(DISCLOSURE_LEGAL_NOTE, { exact: false }).length).toBeGreaterThan(0);
    await act(async () => {
      fireEvent.change(screen.getByLabelText('This episode’s disclosure'), { target: { value: 'Korvala lent us the body.' } });
    });
    expect(screen.queryByRole('list', { name: 'Warnings' })).toBeNull();
    expect(screen.getByLabelText('Composed description').textContent).toBe('Noise test.\n\nKorvala lent us the body.\n\nBench crew.');
  });

  it('keeps the edits and offers to load the saved text when the save meets a newer version (409)', async () => {
    const fetchMock = vi.fn(async (url: string, _init?: RequestInit) => {
      if (url === '/api/auth/csrf') return new Response(JSON.stringify({ token: 't' }), { status: 200 });
      return new Response(JSON.stringify({ error: { code: 'stale_version', message: 'Someone saved this description meanwhile: your changes were not saved.' } }), { status: 409 });
    });
    vi.stubGlobal('fetch', fetchMock);
    renderTab(loaded());
    await act(async () => {
      fireEvent.change(screen.getByLabelText(/What the video is about/), { target: { value: 'My edit.' } });
    });
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Save description' }));
    });
    expect(await screen.findByText('Someone saved this description meanwhile: your changes were not saved.')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Load the saved text (drops your edits)' })).toBeTruthy();
    expect((screen.getByLabelText(/What the video is about/) as HTMLTextAreaElement).value).toBe('My edit.');
    const put = fetchMock.mock.calls.find(([u]) => u === `/api/episodes/${EPISODE}/description`);
    expect(JSON.parse(put![1]!.body as string)).toEqual({ version: 1, summary: 'My edit.', chapters: [], gearLinks: [], disclosure: '' });
  });
});
