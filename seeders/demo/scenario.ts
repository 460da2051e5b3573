/**
 * The demo scenario: an invented studio, its people and three invented shops. Every name,
 * address and number here is made up for the demo; none describes a real business or person.
 */
export const DEMO_PASSWORDS = {
  owner: 'brindle-owner-2026',
  packer: 'brindle-packer-2026',
  buyer: 'brindle-buyer-2026',
} as const

export const DEMO_STUDIO = {
  name: 'Brindlewick Soapery',
  legalName: 'Brindlewick Soapery LLC',
  email: 'hello@brindlewick.test',
  phone: '(555) 014-2290',
  address: ['14 Tannery Row, Unit 3', 'Millbrook, VT 05899', 'US'],
  taxId: 'EIN 00-0000000',
}

export const DEMO_STAFF = [
  { email: 'maren@brindlewick.test', name: 'Maren Oakes', role: 'owner' as const },
  { email: 'teo@brindlewick.test', name: 'Teo Lindqvist', role: 'packer' as const },
]

export const DEMO_TIERS = [
  { name: 'Standard', targetMarginPct: 55, sortOrder: 1 },
  { name: 'Preferred', targetMarginPct: 50, sortOrder: 2 },
  { name: 'Distributor', targetMarginPct: 40, sortOrder: 3 },
]

export const DEMO_SHOPS = [
  {
    legalName: 'Juniper & Vine Mercantile Co.',
    tradingName: 'Juniper & Vine',
    contactName: 'Priya Castellan',
    contactEmail: 'priya@junipervine.test',
    contactPhone: '(555) 018-4471',
    address: {
      line1: '220 Orchard Street',
      line2: '',
      city: 'Fairhaven',
      region: 'MA',
      postalCode: '02719',
      country: 'US',
    },
    taxId: 'MA-RS-4471029',
    tier: 'Preferred',
    paymentTerms: 'net_30' as const,
    storeType: 'Gift shop',
    website: 'https://junipervine.test',
    buyer: { email: 'priya@junipervine.test', name: 'Priya Castellan' },
    certificateExpiresOn: '2027-06-30',
  },
  {
    legalName: 'Harbor Lane General Store LLC',
    tradingName: 'Harbor Lane General',
    contactName: 'Jonah Whitfield',
    contactEmail: 'jonah@harborlane.test',
    contactPhone: '(555) 013-9082',
    address: {
      line1: '9 Wharf Road',
      line2: 'Rear entrance',
      city: 'Port Elsing',
      region: 'ME',
      postalCode: '04011',
      country: 'US',
    },
    taxId: 'ME-R-88120',
    tier: 'Standard',
    paymentTerms: 'prepay' as const,
    storeType: 'General store',
    website: '',
    buyer: { email: 'jonah@harborlane.test', name: 'Jonah Whitfield' },
    certificateExpiresOn: null,
  },
  {
    legalName: 'Quiet Kettle Wellness Supply Inc.',
    tradingName: 'The Quiet Kettle',
    contactName: 'Dell Okafor',
    contactEmail: 'dell@quietkettle.test',
    contactPhone: '(555) 011-3356',
    address: {
      line1: '4100 Commerce Park Dr',
      line2: 'Dock 2',
      city: 'Ridgeview',
      region: 'NY',
      postalCode: '12601',
      country: 'US',
    },
    taxId: 'NY-ST120-551903',
    tier: 'Distributor',
    paymentTerms: 'net_15' as const,
    storeType: 'Distributor',
    website: 'https://quietkettle.test',
    buyer: { email: 'dell@quietkettle.test', name: 'Dell Okafor' },
    certificateExpiresOn: '2027-01-15',
  },
]
