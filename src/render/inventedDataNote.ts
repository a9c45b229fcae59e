/** Said by every encoding of a message built on invented (demo) data, near its top. */
export const INVENTED_DATA_NOTE = 'Invented demo data: not a real forecast for any place.';
