// The invented demo shop that `npm start` seeds into an empty database. Every name and number
// here is made up for demonstration; none describes a real shop, person or machine.

export const DEMO_SHOP_NAME = 'Alder Lane Community Workshop'

export const DEMO_PEOPLE = [
  { role: 'owner', name: 'Maren Oakes', email: 'owner@demo.jogwise.test' },
  { role: 'trainer', name: 'Teodor Lind', email: 'trainer@demo.jogwise.test', pin: '2468' },
  { role: 'operator', name: 'Priya Castell', email: 'operator@demo.jogwise.test' },
  { role: 'trainee', name: 'Sam Ibarra', email: 'trainee@demo.jogwise.test' },
] as const

export const DEMO_MACHINES = [
  {
    name: 'Big Table',
    travelXMm: 1250, travelYMm: 2500, travelZMm: 150,
    units: 'mm', spindleKind: 'water-spindle', hasLengthSensor: true,
    spoilboardMaterial: 'MDF', spoilboardNominalMm: 19, spoilboardMinMm: 12,
    accelMmS2: 400, rapidMmMin: 10000,
    notes: 'Full-sheet gantry router, 1220 × 2440 mm bed, water-cooled spindle with chiller.',
  },
  {
    name: 'Bench Router',
    travelXMm: 620, travelYMm: 620, travelZMm: 90,
    units: 'in', spindleKind: 'trim-router', hasLengthSensor: true,
    spoilboardMaterial: 'MDF', spoilboardNominalMm: 19.05, spoilboardMinMm: 12.7,
    accelMmS2: 600, rapidMmMin: 5000,
    notes: 'Benchtop router, 610 × 610 mm bed, trim router spindle.',
  },
] as const

// Cutters of the demo shop: invented names and ratings, not any maker's catalogue.
export const DEMO_TOOLS = [
  { name: 'Facing cutter 25 mm, 3 inserts', kind: 'surfacing', diameterMm: 25.4, flutes: 3, cornerRadiusMm: 0, maxRpm: 18000, notes: 'For the spoilboard and slab flattening.' },
  { name: 'Facing cutter 50 mm, 2 inserts', kind: 'surfacing', diameterMm: 50.8, flutes: 2, cornerRadiusMm: 0.5, maxRpm: 12000, notes: 'Big Table only: too heavy for the trim router.' },
  { name: 'Straight bit 1/4 in', kind: 'straight', diameterMm: 6.35, flutes: 2, cornerRadiusMm: 0, maxRpm: 24000, notes: null },
  { name: 'Compression bit 6 mm', kind: 'compression', diameterMm: 6, flutes: 2, cornerRadiusMm: 0, maxRpm: 24000, notes: 'Sheet goods with two good faces.' },
  { name: 'V-bit 60°', kind: 'v-bit', diameterMm: 12.7, flutes: 2, cornerRadiusMm: 0, maxRpm: 24000, notes: 'Also for setting X/Y work zero.' },
] as const

export const DEMO_MACHINES_AGE_DAYS = 60

// Maintenance intervals of the demo shop (machine: index into DEMO_MACHINES, null = every machine).
export const DEMO_INTERVALS = [
  { slug: 'spoilboard-resurfacing', machine: 0, everyDays: 30, everySpindleHours: 80 },
  { slug: 'spindle-tram-check', machine: null, everyDays: 90, everySpindleHours: null },
  { slug: 'emergency-stop-test', machine: null, everyDays: 7, everySpindleHours: null },
] as const

/** Seeds the demo shop once: only when the database has no shop at all. */
export async function seedDemoShopIfEmpty(password: string) {
  const db = useDB()
  const [existing] = await db.select({ n: count() }).from(tables.shops)
  if ((existing?.n ?? 0) > 0) return false
  if (!password) throw new Error('NUXT_DEMO_PASSWORD is empty; the demo shop needs a password.')

  const passwordHash = await hashPassword(password)
  await withWriteRetry(() => db.transaction(async (tx) => {
    const [{ id: shopId }] = await tx.insert(tables.shops).values({ name: DEMO_SHOP_NAME, units: 'mm' }).$returningId() as [{ id: number }]
    let ownerId: number | null = null
    for (const p of DEMO_PEOPLE) {
      const [{ id }] = await tx.insert(tables.users).values({
        shopId, name: p.name, email: p.email, role: p.role, passwordHash,
        pinHash: 'pin' in p ? await hashPassword(p.pin) : null,
      }).$returningId() as [{ id: number }]
      if (p.role === 'owner') ownerId = id
    }
    const machineIds: number[] = []
    // The demo routers have been in the shop a while, so intervals never done show as overdue
    // (a machine's intervals count from when it was added: server/utils/due-list.ts).
    const inShopSince = new Date(Date.now() - DEMO_MACHINES_AGE_DAYS * 86_400_000)
    for (const m of DEMO_MACHINES) {
      const [{ id }] = await tx.insert(tables.machines).values({ ...m, shopId, createdAt: inShopSince }).$returningId() as [{ id: number }]
      machineIds.push(id)
    }
    for (const t of DEMO_TOOLS) await tx.insert(tables.tools).values({ ...t, shopId })
    await installStarterLibrary(tx, shopId, ownerId)
    // A few maintenance intervals, so the due list and the Floor tiles show something due.
    const procs = await tx.select({ id: tables.procedures.id, slug: tables.procedures.slug }).from(tables.procedures).where(eq(tables.procedures.shopId, shopId))
    const bySlug = new Map(procs.map(p => [p.slug, p.id]))
    for (const i of DEMO_INTERVALS) {
      const procedureId = bySlug.get(i.slug)
      if (!procedureId) continue
      await tx.insert(tables.maintenanceIntervals).values({
        shopId, procedureId, machineId: i.machine === null ? null : machineIds[i.machine] ?? null,
        everyDays: i.everyDays, everySpindleHours: i.everySpindleHours,
      })
    }
  }))
  return true
}
