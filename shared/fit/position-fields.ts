// Every coordinate field of the FIT profile: the fields whose unit is semicircles
// (FIT SDK profile 21.217, Profile.messages[*].fields[*].units). The test
// tests/shared/fit/position-fields.test.ts compares this table with @garmin/fitsdk's
// Profile, so a new coordinate field in a newer profile fails the test, not privacy.

/** Global message number → field numbers that hold a latitude or longitude. */
export const POSITION_FIELDS: ReadonlyMap<number, ReadonlySet<number>> = new Map([
  [18, new Set([3, 4, 29, 30, 31, 32, 38, 39])], // session: start/end position, bounding box (nec/swc)
  [19, new Set([3, 4, 5, 6, 27, 28, 29, 30])], // lap: start/end position, bounding box
  [20, new Set([0, 1])], // record: position_lat, position_long
  [32, new Set([2, 3])], // course_point
  [128, new Set([10, 11])], // weather_conditions: observed_location_lat/long
  [142, new Set([3, 4, 5, 6, 25, 26, 27, 28])], // segment_lap: start/end position, bounding box
  [150, new Set([1, 2])], // segment_point
  [160, new Set([1, 2])], // gps_metadata
  [285, new Set([5, 6])], // jump
  [312, new Set([17, 18, 19, 20, 21, 22, 23, 24])], // split: bounding box, start/end position
  [317, new Set([0, 1])], // climb_pro
]);

export function isPositionField(globalMessageNumber: number, fieldNumber: number): boolean {
  return POSITION_FIELDS.get(globalMessageNumber)?.has(fieldNumber) ?? false;
}

// Words that make a developer field a position ("position_lat", "Latitude",
// "gpsLong", "location", "gps_position"): the name is split on case changes and non-letters.
const POSITION_WORDS = new Set([
  'lat',
  'latitude',
  'lon',
  'lng',
  'long',
  'longitude',
  'coord',
  'coords',
  'coordinate',
  'coordinates',
  'location',
  'geolocation',
  'geo',
  'geohash',
]);

/**
 * A developer field is a position when its description maps it onto a native
 * coordinate field, its unit is semicircles or degrees of latitude/longitude, or
 * its name says so. "position" alone (a rider's seated/standing position, a pedal
 * position) is not one.
 */
export function isPositionDeveloperField(description: {
  name: string;
  units: string;
  nativeMessageNumber: number | null;
  nativeFieldNumber: number | null;
}): boolean {
  const { name, units, nativeMessageNumber, nativeFieldNumber } = description;
  if (nativeMessageNumber !== null && nativeFieldNumber !== null && isPositionField(nativeMessageNumber, nativeFieldNumber)) {
    return true;
  }
  if (/semicircle/i.test(units)) return true;
  const words = name
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .split(/[^a-z]+/)
    .filter(Boolean);
  if (words.some((word) => POSITION_WORDS.has(word))) return true;
  return words.includes('gps') && words.some((word) => word === 'position' || word === 'pos' || word === 'point');
}
