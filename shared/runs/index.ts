export * from './events'
export * from './fold'
export * from './next-action'
export * from './ledger'
