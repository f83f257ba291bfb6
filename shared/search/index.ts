// Search shared by server and client: normalisation, MiniSearch options, snippets, API types and query rules.
export * from './normalise'
export * from './options'
export * from './snippet'
export * from './types'
export * from './schema'
