import type { ForecastLocation, ForecastSource } from '../forecast/forecastSource.ts';
import type { Channel, ChannelDefaults, Store } from '../store/storeTypes.ts';
import type { Rule } from '../watch/rules/rule.ts';
import type { CommandRequest } from './routerTypes.ts';

/** Everything the router needs, handed in once at start-up. */
export interface RouterDependencies {
  store: Store;
  source: ForecastSource;
  /** Hours of forecast a lookup covers (48 by default). */
  forecastHours: number;
  /** Named shortcuts the source knows (the demo's invented places); null when none matches. */
  findNamedPlace: (name: string) => ForecastLocation | null;
  /** Names to suggest in help (the demo's invented places); empty for real sources. */
  suggestedPlaceNames: string[];
  channelDefaults: ChannelDefaults;
  /** The alert rules as configured (config/rules.yaml), before any channel's overrides. */
  defaultRules: readonly Rule[];
  /** What a user types before the command text on each platform, e.g. "/lapse"; "" in the terminal. */
  commandPrefix: (platform: CommandRequest['platform']) => string;
  localFooterLine?: string;
  nowMs: () => number;
}

/** One request's view: the dependencies plus the channel the request came from. */
export interface HandlerContext extends RouterDependencies {
  channel: Channel;
  request: Pick<CommandRequest, 'platform' | 'userId' | 'canManageChannel' | 'botCanPost'>;
}
