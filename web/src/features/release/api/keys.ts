export const releaseKey = (sittingId: string) => ['release', sittingId] as const;
export const myResultsKey = ['results', 'mine'] as const;
export const resultKey = (resultId: string) => ['results', 'detail', resultId] as const;
export const reportKey = (resultId: string) => ['results', 'report', resultId] as const;
