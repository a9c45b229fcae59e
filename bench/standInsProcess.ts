/**
 * The alert-cycle benchmark's stand-ins, in their own process so that the bot's memory figure is
 * the bot's: the Open-Meteo stand-in (invented demo data, a fixed latency per request) and the Slack
 * and Discord stand-ins. Prints its addresses as one JSON line, then answers `stats` and `stop`
 * (see childLink.ts). It counts what arrived and drops request bodies once answered: the bench
 * needs counts, and a body kept per post would only make this process large.
 *
 *   node --import tsx bench/standInsProcess.ts [latencyMs]
 */
import { memorySampler, serveParent } from './childSide.ts';
import { OpenMeteoStandIn } from '../test/forecast/openMeteoStandIn.ts';
import { SlackStandIn } from '../test/adapters/slackStandIn.ts';
import { DiscordStandIn } from '../test/adapters/discordStandIn.ts';
import type { RecordedCall } from '../test/adapters/recordingServer.ts';

const LIFETIME_MS = 300_000;
const latencyMs = Number(process.argv[2] ?? 0);
const memory = memorySampler();
const forecast = await OpenMeteoStandIn.start({ latencyMs });
const slack = await new SlackStandIn().start();
const discord = await new DiscordStandIn().start();

const counts = { slackPosts: 0, discordPosts: 0, platformErrors: 0 };
const EMPTY = Buffer.alloc(0);
function forget(call: RecordedCall): void {
  call.raw = EMPTY;
  call.body = undefined;
  call.headers = {};
}
slack.onCall((call) => {
  if (call.path === '/api/chat.postMessage' && call.status === 200) counts.slackPosts += 1;
  else if (call.status >= 400) counts.platformErrors += 1;
  forget(call);
});
discord.onCall((call) => {
  if (call.method === 'POST' && /\/channels\/\d+\/messages$/.test(call.path) && call.status === 200) counts.discordPosts += 1;
  else if (call.status >= 400) counts.platformErrors += 1;
  forget(call);
});

serveParent(
  {
    forecastBaseUrl: forecast.baseUrl,
    runInitialisationSeconds: forecast.runInitialisationSeconds,
    slackApiUrl: slack.apiUrl,
    discordApiUrl: discord.apiUrl,
    pid: process.pid,
  },
  async (request) => {
    if (request.cmd !== 'stats') throw new Error(`unknown request ${JSON.stringify(request.cmd)}`);
    return {
      forecastRequests: forecast.forecastRequests,
      metaRequests: forecast.metaRequests,
      ...counts,
      peakRssMb: memory.peakRssMb(),
      peakHeapUsedMb: memory.peakHeapUsedMb(),
    };
  },
  async () => {
    memory.stop();
    await Promise.all([forecast.close(), slack.stop(), discord.stop()]);
  },
  LIFETIME_MS,
);
