import { expect, type Page } from '@playwright/test'

export const DEMO_PASSWORD = process.env.JOGWISE_DEMO_PASSWORD || 'shopfloor-demo-1'
export const DEMO = {
  owner: 'owner@demo.jogwise.test',
  trainer: 'trainer@demo.jogwise.test',
  operator: 'operator@demo.jogwise.test',
  trainee: 'trainee@demo.jogwise.test',
} as const

export async function signIn(page: Page, role: keyof typeof DEMO) {
  await page.goto('/login')
  await page.getByLabel('E-mail').fill(DEMO[role])
  await page.getByLabel('Password').fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page.getByRole('heading', { name: 'Floor' })).toBeVisible()
}
