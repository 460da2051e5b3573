import type { Role } from '@shared/permissions'

/** Every route's path and href in one place. */
export const paths = {
  root: '/',
  signIn: '/sign-in',
  forgotPassword: '/forgot-password',
  setPassword: '/set-password',
  account: '/account',
  owner: {
    home: '/studio',
    team: '/studio/team',
    settings: '/studio/settings',
  },
  packer: {
    home: '/packing',
  },
  buyer: {
    home: '/shop',
  },
} as const

export const homeFor: Record<Role, string> = {
  owner: paths.owner.home,
  packer: paths.packer.home,
  buyer: paths.buyer.home,
}

/** `group` names the sidebar section an item sits in. */
export type NavItem = { to: string; label: string; end?: boolean; group?: string }

/** Each role's own navigation. */
export const navFor: Record<Role, NavItem[]> = {
  owner: [
    { to: paths.owner.home, label: 'Overview', end: true },
    { to: paths.owner.team, label: 'Team', group: 'Studio' },
    { to: paths.owner.settings, label: 'Settings', group: 'Studio' },
  ],
  packer: [{ to: paths.packer.home, label: 'Packing', end: true }],
  buyer: [{ to: paths.buyer.home, label: 'My account', end: true }],
}
