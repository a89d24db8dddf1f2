/** The main areas in the drawer. One entry per area. */
export interface NavItem {
  name: string
  to: string
  icon: string
  label: string
  hint: string
}

export const mainNav: NavItem[] = [
  {
    name: 'vehicles',
    to: '/vehicles',
    icon: 'rv_hookup',
    label: 'Vehicles',
    hint: 'Your rigs and their equipment',
  },
  {
    name: 'scenarios',
    to: '/scenarios',
    icon: 'wb_twilight',
    label: 'Scenarios',
    hint: 'Trips, seasons and places',
  },
  { name: 'reviews', to: '/reviews', icon: 'rate_review', label: 'Reviews', hint: 'Advice on your plans' },
  { name: 'account', to: '/account', icon: 'account_circle', label: 'Account', hint: 'Profile and units' },
]
