// The demo's town. Quillon Vale, its facilities, names, capacities and boundary are invented for ambit's demo; the
// same town (without capacities) is examples/data/quillon-vale.json, and a unit test keeps the two in step.
// Coordinates are projected metres (easting, northing) with the large offsets real projected data has.

export interface Facility {
  id: string;
  name: string;
  kind: 'clinic' | 'library' | 'fire' | 'school' | 'depot' | 'hall';
  x: number;
  y: number;
  /** Invented daily capacity (visits or jobs): the weight of balanced territories. */
  capacity: number;
}

export const TOWN_NAME = 'Quillon Vale';

/** The facility records; QV-14 repeats QV-01's location (an annex filed as its own record), as real lists do. */
export const FACILITIES: readonly Facility[] = [
  { id: 'QV-01', name: 'Harrowgate Clinic', kind: 'clinic', x: 531240.5, y: 6182310.0, capacity: 140 },
  { id: 'QV-02', name: 'Millrace Library', kind: 'library', x: 532980.0, y: 6183475.5, capacity: 60 },
  { id: 'QV-03', name: 'Saltmarsh Fire Post', kind: 'fire', x: 529870.0, y: 6184020.0, capacity: 90 },
  { id: 'QV-04', name: 'Tollbridge School', kind: 'school', x: 533610.0, y: 6180990.0, capacity: 110 },
  { id: 'QV-05', name: 'Cinderfield Depot', kind: 'depot', x: 530455.0, y: 6180140.0, capacity: 180 },
  { id: 'QV-06', name: 'Lanternhill Clinic', kind: 'clinic', x: 534800.0, y: 6182950.0, capacity: 120 },
  { id: 'QV-07', name: 'Oxbow Community Hall', kind: 'hall', x: 531990.0, y: 6185600.0, capacity: 50 },
  { id: 'QV-08', name: 'Wickmere School', kind: 'school', x: 528700.0, y: 6182100.0, capacity: 100 },
  { id: 'QV-09', name: 'Gorsebank Library', kind: 'library', x: 532400.0, y: 6179300.0, capacity: 70 },
  { id: 'QV-10', name: 'Pennyfold Fire Post', kind: 'fire', x: 535900.0, y: 6180400.0, capacity: 95 },
  { id: 'QV-11', name: 'Rookery Lane Depot', kind: 'depot', x: 533300.0, y: 6186800.0, capacity: 160 },
  { id: 'QV-12', name: 'Ferncastle Clinic', kind: 'clinic', x: 529300.0, y: 6186500.0, capacity: 130 },
  { id: 'QV-13', name: 'Brackwater Hall', kind: 'hall', x: 536300.0, y: 6184700.0, capacity: 55 },
  { id: 'QV-14', name: 'Harrowgate Clinic (annex record)', kind: 'clinic', x: 531240.5, y: 6182310.0, capacity: 40 },
];

/** The town limit: a convex ring, counter-clockwise. */
export const BOUNDARY: readonly (readonly [number, number])[] = [[527500, 6178500], [537500, 6178000], [538200, 6184000], [535500, 6188200], [529000, 6188000], [527200, 6183000]];
