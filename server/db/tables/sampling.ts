/** Tables of the sampling area. Filled in by that area. */
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface SamplingTables {}
