// Downloads are plain links (the browser saves the file); the server checks `export:run` on each.
export const exportUrls = {
  piecesCsv: () => '/api/export/pieces.csv',
  trialsCsv: () => '/api/export/trials.csv',
  dublinCore: (pieceId: number) => `/api/pieces/${pieceId}/dublin-core.jsonld`,
  mastersZip: (pieceId: number) => `/api/pieces/${pieceId}/masters.zip`,
} as const;
