/** The conductor-side rules of the electrical engine, one import for the orchestrator. */
export { selectConductor, nextLargerSize } from './conductor'
export { selectConductorForVoltageDrop } from './conductor-for-voltage-drop'
export { sizeOcpd } from './ocpd'
export { voltageDrop } from './voltage-drop'
export { sizeEgc } from './egc'
export { conduitFill } from './conduit-fill'
export { sizeIndex, sizeLabel, drawingSizeLabel } from './sizes'
