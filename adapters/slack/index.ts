export { createSlackApp, startSlackApp, type SlackAppOptions, type RunningSlackApp } from './createSlackApp.ts';
export { createSlackPoster, type SlackPosterOptions } from './slackPoster.ts';
export { slackCommandName, slackCommandDescription } from './slackCommandName.ts';
