/** The mixing height, where other parts of the project expect it; the work lives in mixing/. */
export { mixingHeightAglM } from './mixing/mixingHeight.ts';
