// Every client route in one place; components build links from these, never by hand.
export const paths = {
  home: () => '/',
  signIn: () => '/sign-in',
  archive: () => '/archive',
  piece: (id: number | string) => `/archive/${id}`,
  search: () => '/search',
  shadeSearch: (hex: string, maxDeltaE?: number) => `/search?hex=${hex}${maxDeltaE ? `&maxDeltaE=${maxDeltaE}` : ''}`,
  trials: () => '/trials',
  trial: (id: number | string) => `/trials/${id}`,
  baths: () => '/baths',
  bath: (id: number | string) => `/baths/${id}`,
  series: () => '/series',
  reference: () => '/reference',
  team: () => '/team',
} as const;
