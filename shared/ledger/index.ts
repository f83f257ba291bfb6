// The ledger arithmetic: pure functions on integer cents, shared by pages and server routes.
// Rounding and units are documented at the top of each module.
export * from './money'
export * from './fees'
export * from './profit'
export * from './stats'
export * from './postage'
