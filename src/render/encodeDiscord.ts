import { isActionId, type Message, type MessageAction } from './message.ts';
import { footerOf } from './safetyFooter.ts';
import { INVENTED_DATA_NOTE } from './inventedDataNote.ts';
import { SEVERITY_COLOURS } from './severityPalette.ts';
import { tableTextWithin } from './tableText.ts';
import { fitWithTail, nonEmpty, truncateText } from './textFit.ts';

/** Discord's documented message and embed limits. */
export const DISCORD_LIMITS = {
  content: 2000,
  embedTitle: 256,
  embedDescription: 4096,
  embedFields: 25,
  fieldName: 256,
  fieldValue: 1024,
  footerText: 2048,
  /** Title, description, field names and values, footer text (and author name) together. */
  embedTotal: 6000,
  actionRows: 5,
  buttonsPerRow: 5,
  buttonLabel: 80,
  customId: 100,
} as const;

/** Description kept even when fields crowd the embed: the lines carry the point of the message. */
const DESCRIPTION_FLOOR = 1500;
const FIELD_INLINE_MAX = 40;

export interface DiscordFile {
  fileName: string;
  altText: string;
  png: Uint8Array;
}

export interface DiscordEncoding {
  content: string;
  embeds: object[];
  components: object[];
  /** Nobody is pinged, whatever a place name contains ("@everyone"). */
  allowed_mentions: { parse: never[] };
  /** Images for the adapter to attach; the embed refers to the first as attachment://fileName. */
  files: DiscordFile[];
}

/** custom_id for a button: "ACTION_ID:VALUE". The action id holds no colon, so the first one splits. */
export function discordCustomId(action: Pick<MessageAction, 'actionId' | 'value'>): string {
  return `${action.actionId}:${action.value}`;
}

export function parseDiscordCustomId(customId: string): { actionId: MessageAction['actionId']; value: string } | null {
  const cut = customId.indexOf(':');
  if (cut < 0) return null;
  const actionId = customId.slice(0, cut);
  if (!isActionId(actionId)) return null;
  return { actionId, value: customId.slice(cut + 1) };
}

/** Attachment names Discord accepts in attachment:// URLs. */
function safeFileName(fileName: string): string {
  const cleaned = fileName.replace(/[^A-Za-z0-9._-]/g, '-').slice(-80);
  return cleaned.length > 0 ? cleaned : 'image.png';
}

function descriptionOf(message: Message): string {
  const parts: string[] = [];
  if (message.inventedData) parts.push(`**${INVENTED_DATA_NOTE}**`);
  for (const section of message.sections) {
    const lines = [...(section.heading ? [`**${section.heading}**`] : []), ...section.lines];
    if (lines.length > 0) parts.push(lines.join('\n'));
  }
  if (message.table && (message.table.columns.length > 0 || message.table.rows.length > 0)) {
    parts.push(`\`\`\`\n${tableTextWithin(message.table, 1800)}\n\`\`\``);
  }
  return parts.join('\n\n');
}

/** Cuts a description without leaving a code fence open (an open fence swallows the rest). */
function cutDescription(text: string, maxLength: number): string {
  const cut = truncateText(text, maxLength);
  const fences = (cut.match(/```/g) ?? []).length;
  if (fences % 2 === 0) return cut;
  return truncateText(text, Math.max(0, maxLength - 4)) + '\n```';
}

function componentsOf(actions: MessageAction[]): object[] {
  const seen = new Set<string>();
  const buttons: object[] = [];
  for (const action of actions) {
    const customId = discordCustomId(action);
    // Discord refuses a repeated or overlong custom_id; a cut one would not parse back, so skip it.
    if (customId.length > DISCORD_LIMITS.customId || seen.has(customId)) continue;
    seen.add(customId);
    buttons.push({
      type: 2,
      style: action.actionId === 'show-detail' ? 1 : 2,
      label: truncateText(nonEmpty(action.label.replace(/\s+/g, ' '), action.actionId), DISCORD_LIMITS.buttonLabel),
      custom_id: customId,
    });
  }
  const rows: object[] = [];
  for (let start = 0; start < buttons.length && rows.length < DISCORD_LIMITS.actionRows; start += DISCORD_LIMITS.buttonsPerRow) {
    rows.push({ type: 1, components: buttons.slice(start, start + DISCORD_LIMITS.buttonsPerRow) });
  }
  return rows;
}

/**
 * A message as one Discord embed with buttons. Shortened to Discord's limits, never refused; the
 * safety footer is in the embed's footer and, for readers who hide embeds, in the content too.
 */
export function encodeForDiscord(message: Message): DiscordEncoding {
  const footer = truncateText(footerOf(message), DISCORD_LIMITS.footerText);
  const title = truncateText(nonEmpty(message.title.replace(/\s+/g, ' '), 'Lapsewatch'), DISCORD_LIMITS.embedTitle);

  const allFields = message.sections.flatMap((section) =>
    (section.fields ?? []).map((field) => {
      const value = truncateText(nonEmpty(field.value, '-'), DISCORD_LIMITS.fieldValue);
      return { name: truncateText(nonEmpty(field.label, '-'), DISCORD_LIMITS.fieldName), value, inline: value.length <= FIELD_INLINE_MAX };
    }),
  );
  const description = descriptionOf(message);
  const budget = DISCORD_LIMITS.embedTotal - title.length - footer.length;
  const descriptionFloor = Math.min(description.length, DESCRIPTION_FLOOR);
  const noteRoom = 60;

  const fields: typeof allFields = [];
  let fieldsLength = 0;
  for (const field of allFields) {
    const length = field.name.length + field.value.length;
    if (fields.length >= DISCORD_LIMITS.embedFields || fieldsLength + length > budget - descriptionFloor - noteRoom) break;
    fields.push(field);
    fieldsLength += length;
  }
  const dropped = allFields.length - fields.length;
  const note = dropped > 0 ? `\n*… ${dropped} more figure${dropped === 1 ? '' : 's'} not shown.*` : '';
  const descriptionRoom = Math.min(DISCORD_LIMITS.embedDescription, budget - fieldsLength) - note.length;
  const finalDescription = cutDescription(description, descriptionRoom) + note;

  const firstImage = message.images[0];
  const embed = {
    title,
    color: SEVERITY_COLOURS[message.severity]?.rgb ?? SEVERITY_COLOURS.info.rgb,
    ...(finalDescription.trim().length > 0 ? { description: finalDescription } : {}),
    ...(fields.length > 0 ? { fields } : {}),
    ...(firstImage ? { image: { url: `attachment://${safeFileName(firstImage.fileName)}` } } : {}),
    footer: { text: footer },
  };

  const subtext = footer
    .split('\n')
    .map((line) => `-# ${line}`)
    .join('\n');
  const head = [`**${title}**`, ...(message.inventedData ? [`**${INVENTED_DATA_NOTE}**`] : [])].join('\n');
  return {
    content: fitWithTail(head, subtext, DISCORD_LIMITS.content),
    embeds: [embed],
    components: componentsOf(message.actions),
    allowed_mentions: { parse: [] },
    files: message.images.map((image) => ({ fileName: safeFileName(image.fileName), altText: truncateText(image.altText, 1024), png: image.png })),
  };
}
