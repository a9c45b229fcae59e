export { createSlackApp, startSlackApp, startSlackReceiver, type SlackAppOptions, type SlackReceiverOptions, type RunningSlackApp } from './createSlackApp.ts';
export { createSlackPoster, type SlackPosterOptions } from './slackPoster.ts';
export { slackCommandName, slackCommandDescription } from './slackCommandName.ts';
