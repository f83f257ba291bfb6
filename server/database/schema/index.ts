export * from './accounts'
