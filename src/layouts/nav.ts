/** The main areas in the drawer. One entry per area. */
export interface NavItem {
  name: string
  to: string
  icon: string
  label: string
  hint: string
  /** Shown only to accounts with this role. */
  role?: 'admin'
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
  {
    name: 'compare',
    to: '/side-by-side',
    icon: 'compare_arrows',
    label: 'Side by side',
    hint: 'Compare scenarios',
  },
  {
    name: 'advisors',
    to: '/advisors',
    icon: 'support_agent',
    label: 'Advisors',
    hint: 'People who review plans',
  },
  { name: 'reviews', to: '/reviews', icon: 'rate_review', label: 'Reviews', hint: 'Advice on your plans' },
  { name: 'account', to: '/account', icon: 'account_circle', label: 'Account', hint: 'Profile and units' },
  {
    name: 'admin',
    to: '/admin/users',
    icon: 'admin_panel_settings',
    label: 'People',
    hint: 'Accounts and roles',
    role: 'admin',
  },
]
