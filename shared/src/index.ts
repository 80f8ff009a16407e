export * from './errors.ts';
export * from './color.ts';
