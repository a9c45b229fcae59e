/**
 * One platform-neutral message. Encoders turn it into Slack blocks, Discord embeds or terminal
 * text. Every message carries the safety footer; `buildMessage` in safetyFooter.ts adds it so no
 * caller can forget.
 */
export type MessageKind = 'lookup' | 'alert' | 'summary' | 'detail' | 'help' | 'notice' | 'error';

export interface MessageField {
  label: string;
  /** Value with its unit, already formatted for the channel's unit system. */
  value: string;
}

export interface MessageSection {
  heading?: string;
  lines: string[];
  fields?: MessageField[];
}

export interface MessageTable {
  columns: string[];
  rows: string[][];
}

export interface MessageImage {
  /** File name, e.g. "mixing-48h.png". */
  fileName: string;
  altText: string;
  png: Uint8Array;
}

/** Every button's action id; adapters accept these and no others. */
export const ACTION_IDS = ['mute-rule', 'end-mute', 'show-detail'] as const;
export type ActionId = (typeof ACTION_IDS)[number];

export function isActionId(text: string): text is ActionId {
  return (ACTION_IDS as readonly string[]).includes(text);
}

/** A button. `actionId` is what the router receives back; `value` is opaque to adapters. */
export interface MessageAction {
  actionId: ActionId;
  label: string;
  value: string;
}

export interface Message {
  kind: MessageKind;
  /** Headline, one line. */
  title: string;
  sections: MessageSection[];
  table?: MessageTable;
  images: MessageImage[];
  actions: MessageAction[];
  /** 'warning' for alerts of high severity; encoders may colour by it. */
  severity: 'info' | 'watch' | 'warning';
  /** Set when the data behind the message are invented (the demo source). */
  inventedData: boolean;
  /**
   * Set on an answer that turned on posts to the channel (alerts, summaries): the adapter checks
   * that the bot can post there, and says so at once when it cannot, instead of the first alert
   * failing unseen.
   */
  postsToChannel?: boolean;
  /** The standard safety footer; always present. */
  footer: string;
}
