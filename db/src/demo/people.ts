// Demo people of the fictional channel "Lumen Test Bench". Invented: any likeness to a real
// person is unintended. The fake OAuth provider offers the same accounts at its sign-in page.

/** One account of the local fake sign-in provider, with the role it gets in the demo channel. */
export interface DemoPerson {
  providerId: string;
  login: string;
  name: string;
  email: string;
  role: 'host' | 'editor' | 'producer' | 'admin' | null;
}

export const DEMO_CHANNEL_NAME = 'Lumen Test Bench';

export const DEMO_PEOPLE: DemoPerson[] = [
  { providerId: '910001', login: 'ilse.marrow', name: 'Ilse Marrow', email: 'ilse@lumen-bench.test', role: 'host' },
  { providerId: '910002', login: 'dario.fenwick', name: 'Dario Fenwick', email: 'dario@lumen-bench.test', role: 'editor' },
  { providerId: '910003', login: 'noor.halvard', name: 'Noor Halvard', email: 'noor@lumen-bench.test', role: 'producer' },
  { providerId: '910004', login: 'ada.quillon', name: 'Ada Quillon', email: 'ada@lumen-bench.test', role: 'admin' },
  // Not a member yet: an admin can invite this address to try the invitation flow.
  { providerId: '910005', login: 'sami.okaro', name: 'Sami Okaro', email: 'sami@freelance-cuts.test', role: null },
];
