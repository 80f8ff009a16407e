/** Colours of curves and their swatches: the app's accent first, then clearly different hues (our own palette). */
export const SERIES_COLOURS = ['#b4471a', '#1f5fbf', '#1f6b3a', '#6b3fa0', '#8a5a00', '#0f7a86', '#a3221b', '#4a4a46'];
