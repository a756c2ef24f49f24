/** Policies a sizing may score; `perfect-foresight` rows are always added beside them. */
export const SIZE_POLICIES = Object.freeze(['quantile', 'median', 'point', 'price-taking', 'curve', 'auto'] as const);
export type SizePolicy = (typeof SIZE_POLICIES)[number] | 'perfect-foresight';
