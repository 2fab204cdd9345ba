// Every client route in one place; components build links from these, never by hand.
export const paths = {
  home: () => '/',
  signIn: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  forgotPassword: () => '/forgot-password',
  resetPassword: (token: string) => `/reset-password/${token}`,
  join: (token: string) => `/join/${token}`,
  archive: () => '/archive',
  pieceNew: () => '/archive/new',
  piece: (id: number | string) => `/archive/${id}`,
  pieceEdit: (id: number | string) => `/archive/${id}/edit`,
  search: () => '/search',
  /** A saved search opens Find with its own query string (words, facets, shade). */
  savedSearch: (query: string) => `/search?${query}`,
  shadeSearch: (hex: string, maxDeltaE?: number) => `/search?hex=${hex}${maxDeltaE ? `&maxDeltaE=${maxDeltaE}` : ''}`,
  trials: () => '/trials',
  trial: (id: number | string) => `/trials/${id}`,
  /** `target` preselects what the trial aims at ("region:4", "measurement:9"), e.g. one side of a fading pair. */
  trialNew: (pieceId?: number | string, target?: string, aim?: 'as-made' | 'as-seen') =>
    pieceId != null
      ? `/trials/new?pieceId=${pieceId}${target ? `&target=${encodeURIComponent(target)}` : ''}${aim ? `&aim=${aim}` : ''}`
      : '/trials/new',
  sideBySide: (pieceId: number | string) => `/archive/${pieceId}/side-by-side`,
  /** Recipes to try for one colour of a piece (a palette colour, a region or a reading). */
  suggest: (t: { pieceId?: number | null; paletteColourId?: number; regionId?: number; measurementId?: number }) =>
    `/suggest?${Object.entries(t)
      .filter(([, v]) => v != null)
      .map(([k, v]) => `${k}=${v}`)
      .join('&')}`,
  baths: () => '/baths',
  bath: (id: number | string) => `/baths/${id}`,
  series: () => '/series',
  seriesOne: (id: number | string) => `/series/${id}`,
  reference: () => '/reference',
  team: () => '/team',
  outbox: () => '/outbox',
  photoZoom: (photoId: number | string) => `/photos/${photoId}/zoom`,
  importPieces: () => '/import',
  fixity: () => '/admin/fixity',
  imagingTolerances: () => '/admin/imaging-tolerances',
} as const;
