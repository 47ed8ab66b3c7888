export const resultsKey = ['results'] as const;
