/** Choices a caller may make for any message builder. */
export interface RenderOptions {
  /** One local line shown after the safety footer (from config); it never replaces the footer. */
  footerLocalLine?: string;
  /** Draw the picture (default true). Off for callers that only want text, e.g. a scripted terminal. */
  images?: boolean;
}
