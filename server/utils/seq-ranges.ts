import mysql from 'mysql2'

// The sync read-back leaves out the rows a batch has just stored by their sequence numbers.

/**
 * `and not (r.seq between … or …)` over runs of consecutive sequence numbers: exact, as every
 * number of each range is one of these. MariaDB reads only the index ranges left (issue 14: a
 * list of 500 numbers had it read all 500 rows). Scattered numbers go as a list.
 */
export function seqsLeftOut(seqs: readonly number[]): string {
  if (!seqs.length) return ''
  const sorted = [...seqs].sort((a, b) => a - b)
  const ranges: [number, number][] = []
  for (const n of sorted) {
    const last = ranges[ranges.length - 1]
    if (last && n === last[1] + 1) last[1] = n
    else if (!last || n > last[1]) ranges.push([n, n])
  }
  if (ranges.length > 32) return mysql.format(' and r.seq not in (?)', [sorted])
  return ` and not (${ranges.map(([a, b]) => mysql.format('r.seq between ? and ?', [a, b])).join(' or ')})`
}
