export * from './wall-squat'
export * from './handgrip'
export * from './effort'
