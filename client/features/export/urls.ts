// Downloads are plain links (the browser saves the file); the server checks the right on each:
// `export:run` for pieces, Dublin Core and masters, `trial:read` for trials, the pieces' read rule for palettes and shades.
export const exportUrls = {
  piecesCsv: () => '/api/export/pieces.csv',
  trialsCsv: () => '/api/export/trials.csv',
  palettesCsv: () => '/api/export/palettes.csv',
  piecePalettesCsv: (pieceId: number) => `/api/pieces/${pieceId}/palettes.csv`,
  /** `query` is the shade search's query string (see `shadeExportQuery`). */
  shadeCsv: (query: string) => `/api/export/shade.csv?${query}`,
  dublinCore: (pieceId: number) => `/api/pieces/${pieceId}/dublin-core.jsonld`,
  mastersZip: (pieceId: number) => `/api/pieces/${pieceId}/masters.zip`,
} as const;
