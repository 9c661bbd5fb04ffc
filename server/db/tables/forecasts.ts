/** Tables of the forecast area (organism profiles, forecast runs, windows). Filled in by that area. */
// eslint-disable-next-line @typescript-eslint/no-empty-object-type
export interface ForecastTables {}
