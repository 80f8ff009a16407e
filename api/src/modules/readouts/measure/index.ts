/** The readout engine (issue 6): pure measurements over decoded frames; no database, no HTTP. */
export * from './frame.ts';
export * from './noise.ts';
export * from './recovery.ts';
export * from './verdicts.ts';
export * from './synth.ts';
