/** Tables of the site tides area (constituent sets, feed refreshes). Filled in by that area. */
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface TidesTables {}
