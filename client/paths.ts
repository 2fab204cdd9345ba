// Every client route in one place; components build links from these, never by hand.
export const paths = {
  home: () => '/',
  signIn: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  forgotPassword: () => '/forgot-password',
  resetPassword: (token: string) => `/reset-password/${token}`,
  join: (token: string) => `/join/${token}`,
  archive: () => '/archive',
  piece: (id: number | string) => `/archive/${id}`,
  search: () => '/search',
  trials: () => '/trials',
  trial: (id: number | string) => `/trials/${id}`,
  baths: () => '/baths',
  bath: (id: number | string) => `/baths/${id}`,
  series: () => '/series',
  reference: () => '/reference',
  team: () => '/team',
  outbox: () => '/outbox',
} as const;
