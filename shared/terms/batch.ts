/** A batch's statuses, without zod (the web app's first load). */
export const batchStatuses = ['prepared', 'in_use', 'used_up', 'discarded'] as const;
export type BatchStatus = (typeof batchStatuses)[number];
