/** The design document schema; the other schema modules are imported by path. */
export * from './design'
