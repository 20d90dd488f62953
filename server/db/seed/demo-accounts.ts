/**
 * The invented demo club and its people (listed in the README). Every demo account shares one
 * password so a person trying the app can switch roles quickly.
 */
export const DEMO_PASSWORD = 'chalkline-demo'
export const DEMO_CLUB_NAME = 'Harbour Street Barbell Club'

export const DEMO_ACCOUNTS = {
  admin: { name: 'Front Desk', email: 'desk@harbourstreet.example', role: 'admin', unit: 'kg' },
  coach: { name: 'Ines Marlowe', email: 'ines@harbourstreet.example', role: 'coach', unit: 'kg' },
  /** Intermediate, trains in kilograms on the push / pull / legs plan. */
  lifterKg: { name: 'Ana Kovac', email: 'ana@harbourstreet.example', role: 'lifter', unit: 'kg' },
  /** Beginner, trains in pounds on the upper / lower plan. */
  lifterLb: { name: 'Ben Okafor', email: 'ben@harbourstreet.example', role: 'lifter', unit: 'lb' },
  /** Advanced, kilograms, push / pull / legs. */
  lifterAdvanced: { name: 'Chloe Lindqvist', email: 'chloe@harbourstreet.example', role: 'lifter', unit: 'kg' },
} as const
