import { buildHelpMessage } from '../render/helpMessage.ts';
import type { Message } from '../render/message.ts';
import { parseCommand, type Command } from './commandGrammar.ts';
import { detailFromButton, endMuteFromButton, muteRule } from './handlers/buttonActions.ts';
import { lookUp, showDetail } from './handlers/forecastCommands.ts';
import { forgetPlace, listPlaces, savePlace } from './handlers/placeCommands.ts';
import { endMute, listRules, setThreshold, startMute } from './handlers/ruleCommands.ts';
import { setMorningTime, setUnits } from './handlers/settingsCommands.ts';
import { listWatching, startWatching, stopWatching } from './handlers/watchCommands.ts';
import { channelForCommand } from './channelForCommand.ts';
import { errorMessage, postsStoppedSection } from './replies.ts';
import type { HandlerContext, RouterDependencies } from './routerContext.ts';
import type { ActionRequest, CommandRequest, CommandRouter } from './routerTypes.ts';

/** Which verbs may change what is stored for the channel; the rest only read (channelForCommand.ts). */
const VERB_WRITES: Record<Command['verb'], boolean> = {
  lookup: false,
  detail: false,
  places: false,
  watching: false,
  rules: false,
  help: false,
  save: true,
  forget: true,
  watch: true,
  unwatch: true,
  threshold: true,
  mute: true,
  unmute: true,
  morning: true,
  units: true,
};

/**
 * The one command router every platform feeds. It parses with zod, runs the command and always
 * answers with a message: a user's mistake is one line with a correct example, and a fault on our
 * side is reported as such, with nothing changed and nothing thrown to the adapter.
 */
export function createCommandRouter(dependencies: RouterDependencies, onFault: (error: unknown, what: string) => void = () => {}): CommandRouter {
  /** Runs `work` for the request's channel; the first answer in a channel that had been marked inactive says what that stopped. */
  async function inChannel(
    request: Pick<CommandRequest, 'platform' | 'teamId' | 'channelId' | 'userId' | 'canManageChannel'> & Partial<Pick<CommandRequest, 'botCanPost'>>,
    writes: boolean,
    work: (context: HandlerContext) => Promise<Message>,
  ): Promise<Message> {
    const target = { platform: request.platform, teamId: request.teamId, channelId: request.channelId };
    const { channel, inactiveSinceMs } = await channelForCommand(dependencies.store, target, dependencies.channelDefaults, dependencies.nowMs(), writes);
    const message = await work({ ...dependencies, channel, request });
    return inactiveSinceMs === null ? message : { ...message, sections: [...message.sections, postsStoppedSection(inactiveSinceMs)] };
  }

  async function guarded(what: string, work: () => Promise<Message>): Promise<Message> {
    try {
      return await work();
    } catch (error) {
      onFault(error, what);
      return errorMessage('Something went wrong on our side and nothing was changed. Please try again in a minute.', dependencies.localFooterLine);
    }
  }

  function run(context: HandlerContext, command: Command): Promise<Message> {
    switch (command.verb) {
      case 'lookup':
        return lookUp(context, command.place);
      case 'detail':
        return showDetail(context, command.place, command.localHour, command.dayOffset);
      case 'save':
        return savePlace(context, command.name, command.latitudeDeg, command.longitudeDeg);
      case 'places':
        return listPlaces(context);
      case 'forget':
        return forgetPlace(context, command.name);
      case 'watch':
        return startWatching(context, command.place);
      case 'unwatch':
        return stopWatching(context, command.place);
      case 'watching':
        return listWatching(context);
      case 'rules':
        return listRules(context);
      case 'threshold':
        return setThreshold(context, command.ruleId, command.value);
      case 'mute':
        return startMute(context, command.ruleId, command.place);
      case 'unmute':
        return endMute(context, command.ruleId, command.place);
      case 'morning':
        return setMorningTime(context, command.localTime);
      case 'units':
        return setUnits(context, command.unitSystem);
      case 'help':
        return Promise.resolve(
          buildHelpMessage(dependencies.commandPrefix(context.request.platform), {
            inventedData: dependencies.suggestedPlaceNames.length > 0,
            demoPlaceNames: dependencies.suggestedPlaceNames,
            localFooterLine: dependencies.localFooterLine,
          }),
        );
    }
  }

  return {
    handleCommand(request: CommandRequest): Promise<Message> {
      const parsed = parseCommand(typeof request.text === 'string' ? request.text : '');
      if (!parsed.ok) return Promise.resolve(errorMessage(parsed.error, dependencies.localFooterLine));
      const { command } = parsed;
      return guarded(`command ${command.verb}`, () => inChannel(request, VERB_WRITES[command.verb], (context) => run(context, command)));
    },
    handleAction(request: ActionRequest): Promise<Message> {
      return guarded(`action ${request.actionId}`, () =>
        inChannel(request, request.actionId !== 'show-detail', async (context) => {
          if (request.actionId === 'mute-rule') return muteRule(context, request.value);
          if (request.actionId === 'end-mute') return endMuteFromButton(context, request.value);
          if (request.actionId === 'show-detail') return detailFromButton(context, request.value);
          return errorMessage(`Unknown button "${String(request.actionId)}". Nothing was changed.`, dependencies.localFooterLine);
        }),
      );
    },
  };
}
