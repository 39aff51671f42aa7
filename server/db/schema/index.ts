export * from './venues'
export * from './users'
export * from './mail'
export * from './products'
