/**
 * Invented stations of the local tide feed stand-in, near the demo sites (server/seed/demo-organisation.ts)
 * and the test sites. Names, positions and numbers are made up; they are plausible for sheltered farm
 * waters: depth-mean tidal currents of 0.1 to 0.5 m/s at springs, mixed, mainly semidiurnal tides
 * (form factor (K1 + O1)/(M2 + S2) between 0.25 and 1.5).
 * Feed format: amplitude (m/s semi-major axis for a current, m for a level), phase_deg (Greenwich phase lag),
 * minor (m/s, signed, positive anticlockwise) and inclination_deg (anticlockwise from east) for currents.
 */

export interface StandInConstituent {
  name: string;
  amplitude: number;
  phase_deg: number;
  minor?: number;
  inclination_deg?: number;
}

export interface StandInStation {
  id: string;
  name: string;
  latitude: number;
  longitude: number;
  current: { axis_deg: number | null; constituents: StandInConstituent[] } | null;
  level: { datum_m: number; constituents: StandInConstituent[] } | null;
}

type Row = [name: string, amplitude: number, phase: number];

/** A current along one axis (rectilinear), or a slightly rotary one when minorRatio ≠ 0. */
function current(axisDeg: number, rows: Row[], minorRatio = 0): StandInStation['current'] {
  return {
    axis_deg: axisDeg,
    constituents: rows.map(([name, amplitude, phase], k) => ({
      name,
      amplitude,
      phase_deg: phase,
      minor: Math.round(amplitude * minorRatio * 1000) / 1000,
      // The smaller constituents' ellipses lean a few degrees off the main axis.
      inclination_deg: axisDeg + (k === 0 ? 0 : ((k * 7) % 9) - 4),
    })),
  };
}

function level(datum: number, rows: Row[]): StandInStation['level'] {
  return { datum_m: datum, constituents: rows.map(([name, amplitude, phase]) => ({ name, amplitude, phase_deg: phase })) };
}

export const STAND_IN_STATIONS: StandInStation[] = [
  {
    id: 'SKN-01',
    name: 'Skerry Narrows buoy',
    latitude: 56.405,
    longitude: -5.742,
    current: current(35, [['M2', 0.24, 172], ['S2', 0.08, 205], ['N2', 0.045, 150], ['K2', 0.022, 203], ['K1', 0.06, 95], ['O1', 0.048, 343], ['P1', 0.02, 93], ['Q1', 0.01, 310], ['M4', 0.02, 64]], 0.08),
    level: level(2.1, [['M2', 1.18, 158], ['S2', 0.44, 191], ['N2', 0.23, 137], ['K2', 0.12, 189], ['K1', 0.26, 80], ['O1', 0.21, 330], ['P1', 0.085, 78], ['Q1', 0.05, 298], ['M4', 0.03, 210]]),
  },
  {
    id: 'LRS-02',
    name: 'Lorn Sound approach',
    latitude: 56.47,
    longitude: -5.62,
    current: current(290, [['M2', 0.18, 181], ['S2', 0.06, 214], ['N2', 0.035, 160], ['K1', 0.045, 101], ['O1', 0.04, 349]]),
    level: level(2.0, [['M2', 1.1, 161], ['S2', 0.42, 194], ['N2', 0.22, 140], ['K1', 0.24, 83], ['O1', 0.2, 333]]),
  },
  {
    id: 'HRF-01',
    name: 'Heron Flats channel',
    latitude: 53.212,
    longitude: -9.465,
    current: current(120, [['M2', 0.25, 118], ['S2', 0.085, 150], ['N2', 0.05, 98], ['K2', 0.025, 148], ['K1', 0.065, 68], ['O1', 0.05, 318], ['M4', 0.03, 12], ['MS4', 0.015, 48]], -0.05),
    level: level(2.6, [['M2', 1.55, 125], ['S2', 0.55, 158], ['N2', 0.3, 105], ['K2', 0.15, 155], ['K1', 0.33, 72], ['O1', 0.27, 322], ['M4', 0.04, 20]]),
  },
  {
    id: 'KBQ-01',
    name: 'Kilbrack Quay tide gauge',
    latitude: 53.26,
    longitude: -9.39,
    current: null,
    level: level(2.55, [['M2', 1.52, 127], ['S2', 0.54, 160], ['N2', 0.29, 107], ['K2', 0.15, 157], ['K1', 0.32, 73], ['O1', 0.26, 323]]),
  },
  {
    id: 'EWD-01',
    name: 'Eastwick Deep mooring',
    latitude: 60.865,
    longitude: 4.93,
    current: current(75, [['M2', 0.11, 302], ['S2', 0.04, 335], ['N2', 0.022, 281], ['K1', 0.03, 190], ['O1', 0.022, 80]], 0.2),
    level: level(0.9, [['M2', 0.52, 290], ['S2', 0.19, 322], ['N2', 0.1, 268], ['K1', 0.13, 175], ['O1', 0.06, 65]]),
  },
  {
    id: 'CMS-01',
    name: 'Cairnmore Sound',
    latitude: 57.115,
    longitude: -6.185,
    current: current(60, [['M2', 0.24, 140], ['S2', 0.085, 172], ['N2', 0.055, 121], ['K2', 0.027, 170], ['K1', 0.07, 85], ['O1', 0.055, 331], ['M4', 0.025, 300]]),
    level: level(2.4, [['M2', 1.3, 150], ['S2', 0.48, 183], ['N2', 0.25, 129], ['K2', 0.13, 181], ['K1', 0.28, 78], ['O1', 0.23, 328]]),
  },
];

/** Great-circle distance, km (haversine, mean Earth radius 6371 km). */
export function distanceKm(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const rad = Math.PI / 180;
  const dLat = (lat2 - lat1) * rad;
  const dLon = (lon2 - lon1) * rad;
  const a = Math.sin(dLat / 2) ** 2 + Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * 6371 * Math.asin(Math.min(1, Math.sqrt(a)));
}
