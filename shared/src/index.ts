export * from './errors.ts';
export * from './api/errors.ts';
export * from './schemas/common.ts';
export * from './schemas/channels.ts';
export * from './color.ts';
