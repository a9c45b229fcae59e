/**
 * Converters from the unit strings a provider states to the project's units. Null when the unit is
 * not one we know: the caller refuses the response rather than guess.
 */
export function toCelsius(unit: string | undefined): ((value: number) => number) | null {
  if (unit === '°C' || unit === 'C' || unit === 'celsius') return (value) => value;
  if (unit === '°F' || unit === 'F' || unit === 'fahrenheit') return (value) => ((value - 32) * 5) / 9;
  return null;
}

export function toMetresPerSecond(unit: string | undefined): ((value: number) => number) | null {
  switch (unit) {
    case 'm/s':
      return (value) => value;
    case 'km/h':
      return (value) => value / 3.6;
    case 'mp/h':
    case 'mph':
      return (value) => value * 0.44704;
    case 'kn':
    case 'kt':
      return (value) => (value * 1852) / 3600;
    default:
      return null;
  }
}

export function toHectopascals(unit: string | undefined): ((value: number) => number) | null {
  if (unit === 'hPa' || unit === 'mb') return (value) => value;
  if (unit === 'Pa') return (value) => value / 100;
  return null;
}

export function toMetres(unit: string | undefined): ((value: number) => number) | null {
  if (unit === 'm' || unit === 'gpm' || unit === 'meter' || unit === 'metre') return (value) => value;
  return null;
}

export function toDegrees(unit: string | undefined): ((value: number) => number) | null {
  if (unit === '°' || unit === 'deg' || unit === 'degrees') return (value) => value;
  return null;
}
