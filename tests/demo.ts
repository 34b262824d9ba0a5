// The invented demo shop's sign-ins (server/utils/demo-shop.ts), shared by the API and browser
// tests. The password is the one scripts/test.sh gives the seed.
export const DEMO_PASSWORD = process.env.JOGWISE_DEMO_PASSWORD || 'shopfloor-demo-1'
export const DEMO = {
  owner: 'owner@demo.jogwise.test',
  trainer: 'trainer@demo.jogwise.test',
  operator: 'operator@demo.jogwise.test',
  trainee: 'trainee@demo.jogwise.test',
} as const
export type DemoRole = keyof typeof DEMO
