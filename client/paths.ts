// Every client route in one place; components build links from these, never by hand.
export const paths = {
  home: () => '/',
  signIn: () => '/sign-in',
  archive: () => '/archive',
  pieceNew: () => '/archive/new',
  piece: (id: number | string) => `/archive/${id}`,
  pieceEdit: (id: number | string) => `/archive/${id}/edit`,
  search: () => '/search',
  trials: () => '/trials',
  trial: (id: number | string) => `/trials/${id}`,
  baths: () => '/baths',
  bath: (id: number | string) => `/baths/${id}`,
  series: () => '/series',
  reference: () => '/reference',
  team: () => '/team',
} as const;
