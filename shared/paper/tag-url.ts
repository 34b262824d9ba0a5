// Machine tags: the QR code on each machine opens its Start screen on any tablet of the shop.
// The address carries the shop's id, so a tablet can tell a tag of another shop (or of another
// Jogwise server) from its own and say so, instead of opening a machine that happens to share
// the number.

export function machineTagUrl(origin: string, shopId: number, machineId: number): string {
  return `${origin.replace(/\/+$/, '')}/tag/${shopId}/${machineId}`
}

export function procedureUrl(origin: string, procedureId: number): string {
  return `${origin.replace(/\/+$/, '')}/library/${procedureId}`
}

export type ScannedCode =
  | { kind: 'machine', machineId: number }
  | { kind: 'procedure', procedureId: number }
  | { kind: 'other-shop' }
  | { kind: 'not-jogwise' }

const TAG_PATH = /^\/tag\/(\d{1,10})\/(\d{1,10})\/?$/
const PROCEDURE_PATH = /^\/library\/(\d{1,10})\/?$/

/** What a scanned text means to this tablet (its own origin and shop). */
export function readScannedCode(text: string, here: { origin: string, shopId: number }): ScannedCode {
  let url: URL
  try { url = new URL(text.trim()) }
  catch { return { kind: 'not-jogwise' } }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return { kind: 'not-jogwise' }
  const tag = TAG_PATH.exec(url.pathname)
  if (tag) {
    if (url.origin !== here.origin || Number(tag[1]) !== here.shopId) return { kind: 'other-shop' }
    return { kind: 'machine', machineId: Number(tag[2]) }
  }
  const procedure = PROCEDURE_PATH.exec(url.pathname)
  if (procedure && url.origin === here.origin) return { kind: 'procedure', procedureId: Number(procedure[1]) }
  return { kind: 'not-jogwise' }
}
