import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { planSurfacing, surfacingPreview, type SurfacingInput } from '#shared/machining'
import PlannerPreview from '~/components/planner/PlannerPreview.vue'

// The Planner's top view draws what the plan cuts: one line per raster line, the cutter's
// swept width, and the area's dimensions, with work Y flipped so the front edge is at the
// bottom of the screen.

const BASE: SurfacingInput = {
  units: 'mm', area: { x: 600, y: 400 }, cutter: { diameter: 25.4, flutes: 2 }, stepoverPct: 50,
  totalDepth: 1, depthPerPass: 0.5, feed: 2500, plunge: 500, rpm: 16000,
  direction: 'x', pattern: 'zigzag', safeZ: 5,
}

function previewOf(input: SurfacingInput) {
  const result = planSurfacing(input)
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return surfacingPreview(result.plan)
}
const nums = (el: { attributes: (name: string) => string | undefined }, ...names: string[]) => names.map(n => Number(el.attributes(n)))

describe('PlannerPreview', () => {
  // Line counts by hand: the fewest evenly spaced lines over the step-axis span whose spacing
  // is at most the stepover, i.e. ceil(span / stepover) + 1 (Jogwise layout convention).
  it.each([
    ['lines along X over Y = 400 mm at 12.7 mm', BASE, 33],
    ['lines along Y over X = 600 mm at 12.7 mm', { ...BASE, direction: 'y' as const }, 49],
    ['one way with 10 mm overhang, span 420 mm at 17.78 mm', { ...BASE, pattern: 'one-way' as const, overhang: 10, stepoverPct: 70 }, 25],
    ['inch board 24 × 48 in, lines along X over 48 in at 0.5 in', { ...BASE, units: 'in' as const, area: { x: 24, y: 48 }, cutter: { diameter: 1, flutes: 2 }, totalDepth: 0.04, depthPerPass: 0.02, feed: 100, plunge: 20, safeZ: 0.2 }, 97],
  ])('draws one line per raster line: %s', async (_what, input, lines) => {
    const preview = previewOf(input)
    expect(preview.lines).toHaveLength(lines)
    const wrapper = await mountSuspended(PlannerPreview, { props: { preview } })
    expect(wrapper.findAll('[data-testid="raster-line"]')).toHaveLength(lines)
    // Zigzag joins neighbouring lines with a stepover; one-way does not.
    expect(wrapper.findAll('line.stroke-go[stroke-dasharray]')).toHaveLength(input.pattern === 'zigzag' ? lines - 1 : 0)
    expect(wrapper.text()).toContain(`${lines} lines along ${input.direction.toUpperCase()}`)
  })

  it('places the lines in work coordinates with Y flipped and the swept width of the cutter', async () => {
    const preview = previewOf(BASE)
    const wrapper = await mountSuspended(PlannerPreview, { props: { preview } })
    const drawn = wrapper.findAll('[data-testid="raster-line"]')
    // First line on the front edge (work Y 0), last on the back edge (work Y 400 → SVG y -400).
    expect(nums(drawn[0]!, 'x1', 'y1', 'x2', 'y2')).toEqual([0, 0, 600, 0])
    expect(nums(drawn.at(-1)!, 'y1', 'y2')).toEqual([-400, -400])
    // Zigzag: the second line runs back from X 600 to X 0.
    expect(nums(drawn[1]!, 'x1', 'x2')).toEqual([600, 0])
    // The swept band is as wide as the cutter and covers the whole area: its edges lie half a
    // diameter (12.7 mm) past the area on every side.
    expect(Number(wrapper.get('[data-testid="swept"]').attributes('stroke-width'))).toBe(25.4)
    const b = preview.bounds
    for (const [got, want] of [[b.minX, -12.7], [b.minY, -12.7], [b.maxX, 612.7], [b.maxY, 412.7]] as const) expect(got).toBeCloseTo(want, 9)
    expect(wrapper.get('[data-testid="dim-x"]').text()).toBe('X 600.00 mm')
    expect(wrapper.get('[data-testid="dim-y"]').text()).toBe('Y 400.00 mm')
    // The view box holds the swept band with room for the dimensions.
    const [vx, vy, vw, vh] = wrapper.get('svg').attributes('viewBox')!.split(' ').map(Number) as [number, number, number, number]
    expect(vx).toBeLessThan(-12.7)
    expect(vy).toBeLessThan(-412.7)
    expect(vx + vw).toBeGreaterThan(612.7)
    expect(vy + vh).toBeGreaterThan(12.7)
  })
})
