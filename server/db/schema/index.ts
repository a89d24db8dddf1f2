// One file per area; this index is what drizzle-kit and the client read.
// Add a line per new area file (keep the edit to one line to avoid clashes).
export * from './auth'
export * from './mail'
export * from './ratelimit'
export * from './vehicles'
export * from './scenarios'
export * from './history'
export * from './crew'
export * from './reviews'
export * from './payments'
export * from './logs'
export * from './buildsheet'
