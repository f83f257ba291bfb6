export * from './accounts'
export * from './photos'
export * from './wiki'
