// Readiness probe for the start and test scripts: the server answers and the database too.
export default defineEventHandler(async () => {
  const [row] = await useDB().select({ shops: count() }).from(tables.shops)
  return { ok: true, shops: row?.shops ?? 0 }
})
