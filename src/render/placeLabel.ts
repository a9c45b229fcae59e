/** A place's display name, or its point when it has none: "44.812, -115.432". */
export function placeLabel(location: { latitude: number; longitude: number; name?: string }): string {
  const name = location.name?.trim();
  return name && name.length > 0 ? name : `${location.latitude.toFixed(3)}, ${location.longitude.toFixed(3)}`;
}
