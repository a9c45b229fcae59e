/** The Web API base option, when one is configured: the client joins method names onto it, so it ends in "/". */
export function slackApiUrlOption(apiUrl: string | undefined): { slackApiUrl?: string } {
  if (!apiUrl) return {};
  return { slackApiUrl: apiUrl.endsWith('/') ? apiUrl : `${apiUrl}/` };
}

/**
 * Web API client options for answering a person: a couple of quick retries, not the client's
 * default of ten over thirty minutes: an answer that late is no answer, and pending retries keep
 * the process from exiting. (Scheduled posts use the outbox's own retry policy instead.)
 */
export function answerClientOptions(apiUrl: string | undefined, timeoutMs = 10_000) {
  return { ...slackApiUrlOption(apiUrl), retryConfig: { retries: 2, minTimeout: 500, maxTimeout: 2_000 }, timeout: timeoutMs };
}
