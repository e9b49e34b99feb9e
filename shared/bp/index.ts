export * from './classify'
export * from './average'
