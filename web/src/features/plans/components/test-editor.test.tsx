// The test editor runs the shared generator on every keystroke: when the range or the kit
// changes, the preview table follows; when the input is refused, the generator's message shows.
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { ToastProvider } from '../../../components/ui/toast.tsx';
import { TestEditor } from './test-editor.tsx';

function renderEditor(kind: 'iso_sweep' | 'latitude_bracket' | 'custom') {
  const qc = new QueryClient();
  return render(
    <QueryClientProvider client={qc}>
      <ToastProvider>
        <TestEditor episodeId="00000000-0000-4000-8000-000000000001" kind={kind} onDone={() => undefined} />
      </ToastProvider>
    </QueryClientProvider>,
  );
}

const rowHeaders = () => within(screen.getByRole('table')).getAllByRole('rowheader').map((c) => c.textContent);

async function type(label: string, value: string) {
  await act(async () => {
    fireEvent.change(screen.getByLabelText(label), { target: { value } });
  });
}

afterEach(cleanup);

describe('TestEditor', () => {
  it('shows the ISO ladder of the default sweep and follows the highest ISO as it is typed', async () => {
    renderEditor('iso_sweep');
    // Default: base 800, 100–12800 in full stops (ISO 12232 full-stop series).
    expect(rowHeaders()).toEqual(['100', '200', '400', '800', '1600', '3200', '6400', '12800']);
    await type('Highest ISO', '1600');
    expect(rowHeaders()).toEqual(['100', '200', '400', '800', '1600']);
    await act(async () => {
      fireEvent.change(screen.getByLabelText('Step'), { target: { value: 'third' } });
    });
    expect(rowHeaders()).toEqual(['100', '125', '160', '200', '250', '320', '400', '500', '640', '800', '1000', '1250', '1600']);
  });

  it('says what is wrong when the range is reversed, and offers no save', async () => {
    renderEditor('iso_sweep');
    await type('Lowest ISO', '3200');
    await type('Highest ISO', '400');
    expect(screen.getAllByText('The ISO range is reversed: lowest ISO 3200 is above highest ISO 400; swap them.').length).toBeGreaterThan(0);
    expect(screen.queryByRole('table')).toBeNull();
    expect((screen.getByRole('button', { name: 'Add test' }) as HTMLButtonElement).disabled).toBe(true);
  });

  it('flags a step the kit cannot hold once ND runs out', async () => {
    renderEditor('iso_sweep');
    await type('ND densities on hand', '0, 0.3, 0.6, 0.9');
    await type('Narrowest aperture', '4');
    // Base ND is already the densest on hand and the lens cannot stop down: ISO 1600 and up cannot be held.
    const table = screen.getByRole('table');
    expect(within(table).getByText(/cannot be held/)).toBeTruthy();
    expect(within(table).getAllByText(/less light than the kit can take away/).length).toBe(4);
  });

  it('lists a bracket from −N to +N with the grade correction', async () => {
    renderEditor('latitude_bracket');
    await type('Range ± (stops)', '2');
    expect(rowHeaders()).toEqual(['−2', '−1', '0', '+1', '+2']);
    expect(screen.getByText('+2 stops in the grade')).toBeTruthy();
  });
});
