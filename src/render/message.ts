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

/** A button. `actionId` is what the router receives back; `value` is opaque to adapters. */
export interface MessageAction {
  actionId: 'mute-rule' | 'show-detail';
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
  /** The standard safety footer; always present. */
  footer: string;
}
