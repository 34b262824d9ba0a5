import jsQR from 'jsqr'
import { expect, test } from '@playwright/test'
import { signIn, hydrated } from './helpers'

// The printable machine tags (issue 17): each tag's QR code, as the browser draws it, decoded
// by jsQR (ISO/IEC 18004; a decoder independent of the qrcode encoder) gives the address of
// that machine's tag page, which opens its Start screen.

test('each machine tag decodes to its own address and opens the machine', async ({ page }) => {
  await signIn(page, 'owner')
  await page.goto('/machines')
  await hydrated(page)
  await page.getByRole('link', { name: 'Tags and paper' }).click()
  const tags = page.locator('[data-tag-url]')
  await expect(tags.first()).toBeVisible()
  const shop = await (await page.request.get('/api/shop')).json()
  const machines = await (await page.request.get('/api/machines')).json()
  expect(await tags.count()).toBe(machines.length)
  const first = tags.first()
  // The tag's SVG drawn onto a canvas at 8 px per unit, read back as pixels.
  const image = await first.locator('svg').evaluate(async (svg: SVGSVGElement) => {
    const side = svg.viewBox.baseVal.width * 8
    const img = new Image()
    img.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(new XMLSerializer().serializeToString(svg))}`
    await img.decode()
    const canvas = document.createElement('canvas')
    canvas.width = canvas.height = side
    const ctx = canvas.getContext('2d')!
    ctx.imageSmoothingEnabled = false
    ctx.drawImage(img, 0, 0, side, side)
    return { side, data: Array.from(ctx.getImageData(0, 0, side, side).data) }
  })
  const text = jsQR(new Uint8ClampedArray(image.data), image.side, image.side)?.data
  expect(text).toBe(`${new URL(page.url()).origin}/tag/${shop.id}/${machines[0].id}`)
  expect(await first.getAttribute('data-tag-url')).toBe(text)
  await page.goto(new URL(text!).pathname)
  await hydrated(page)
  await expect(page).toHaveURL(new RegExp(`/start/${machines[0].id}$`))
})
