/** The store's public surface. Import from here, not from the files behind it. */
export { openStore, type OpenStoreOptions } from './openStore.ts';
export { StoreError, isStoreError, type StoreErrorCode } from './storeError.ts';
export {
  alertDedupeKey,
  channelTargetKey,
  crossingKeyOf,
  locationKeyOf,
  placeNameKey,
  summaryDedupeKey,
} from './storeKeys.ts';
export { parseStoreUrl, redactPassword } from './storeUrl.ts';
export * from './storeTypes.ts';
