/**
 * A place's part of a crossing key: latitude and longitude rounded to 0.01° (about 1 km), so the
 * same fire typed with a little more or less precision keeps its keys; -0.00 is written 0.00.
 */
export function locationKey(latitude: number, longitude: number): string {
  const rounded = (degrees: number): string => {
    const text = (Math.round(degrees * 100) / 100).toFixed(2);
    return text === '-0.00' ? '0.00' : text;
  };
  return `${rounded(latitude)},${rounded(longitude)}`;
}

export function crossingKey(parts: { locationKey: string; ruleId: string; localDate: string; direction: string }): string {
  return `${parts.locationKey}|${parts.ruleId}|${parts.localDate}|${parts.direction}`;
}
