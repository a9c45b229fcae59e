/** Credentials by the platforms' usual environment variable names; a platform starts only when its set is complete. */
export interface PlatformCredentials {
  slack: { botToken: string; signingSecret?: string; appToken?: string; apiUrl?: string } | null;
  discord: { token: string; applicationId: string; apiUrl?: string } | null;
  /** Sets that were started but are incomplete, named for the start-up log (never the values). */
  incomplete: string[];
}

export function readPlatformCredentials(environment: NodeJS.ProcessEnv): PlatformCredentials {
  const value = (name: string) => {
    const raw = environment[name]?.trim();
    return raw && raw.length > 0 ? raw : undefined;
  };
  const incomplete: string[] = [];
  const botToken = value('SLACK_BOT_TOKEN');
  const signingSecret = value('SLACK_SIGNING_SECRET');
  const appToken = value('SLACK_APP_TOKEN');
  let slack: PlatformCredentials['slack'] = null;
  if (botToken && (signingSecret || appToken)) {
    slack = { botToken, ...(signingSecret ? { signingSecret } : {}), ...(appToken ? { appToken } : {}), ...(value('SLACK_API_URL') ? { apiUrl: value('SLACK_API_URL') } : {}) };
  } else if (botToken || signingSecret || appToken) {
    incomplete.push('Slack needs SLACK_BOT_TOKEN and either SLACK_SIGNING_SECRET (HTTP mode) or SLACK_APP_TOKEN (Socket Mode)');
  }
  const token = value('DISCORD_TOKEN');
  const applicationId = value('DISCORD_APPLICATION_ID');
  let discord: PlatformCredentials['discord'] = null;
  if (token && applicationId) {
    discord = { token, applicationId, ...(value('DISCORD_API_URL') ? { apiUrl: value('DISCORD_API_URL') } : {}) };
  } else if (token || applicationId) {
    incomplete.push('Discord needs both DISCORD_TOKEN and DISCORD_APPLICATION_ID');
  }
  return { slack, discord, incomplete };
}
