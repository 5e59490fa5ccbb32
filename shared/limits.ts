/** Largest FIT file a rider may upload (a 12-hour ride at 1 Hz is far below this). */
export const MAX_FIT_FILE_BYTES = 25 * 1024 * 1024;
export const MAX_NOTES_LENGTH = 2000;
export const FIT_FILE_FIELDS = ['fileA', 'fileB'] as const;
