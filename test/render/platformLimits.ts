/**
 * Independent checks of what Slack and Discord accept, written from their documentation (Slack
 * Block Kit reference: blocks, section, header, context, actions, button; Discord developer docs:
 * message and embed limits, message components). They do not reuse the encoders' constants, so a
 * wrong constant in the code fails here.
 */
type Json = Record<string, unknown>;

export function slackProblems(encoding: { text: string; blocks: object[] }): string[] {
  const problems: string[] = [];
  const blocks = encoding.blocks as Json[];
  if (blocks.length > 50) problems.push(`blocks ${blocks.length} > 50`);
  if (encoding.text.length > 4000) problems.push(`fallback text ${encoding.text.length} > 4000`);
  blocks.forEach((block, index) => {
    const where = `block ${index} (${String(block.type)})`;
    const textOf = (value: unknown): string => ((value as Json | undefined)?.text as string | undefined) ?? '';
    switch (block.type) {
      case 'header': {
        const text = textOf(block.text);
        if (text.length === 0 || text.length > 150) problems.push(`${where}: header text length ${text.length}`);
        break;
      }
      case 'section': {
        const fields = (block.fields as Json[] | undefined) ?? [];
        if (!block.text && fields.length === 0) problems.push(`${where}: neither text nor fields`);
        if (block.text) {
          const text = textOf(block.text);
          if (text.length === 0 || text.length > 3000) problems.push(`${where}: text length ${text.length}`);
        }
        if (fields.length > 10) problems.push(`${where}: ${fields.length} fields`);
        for (const field of fields) {
          const text = textOf(field);
          if (text.length === 0 || text.length > 2000) problems.push(`${where}: field length ${text.length}`);
        }
        break;
      }
      case 'context': {
        const elements = block.elements as Json[];
        if (elements.length === 0 || elements.length > 10) problems.push(`${where}: ${elements.length} elements`);
        for (const element of elements) if (textOf(element).length > 3000) problems.push(`${where}: element too long`);
        break;
      }
      case 'actions': {
        const elements = block.elements as Json[];
        if (elements.length === 0 || elements.length > 25) problems.push(`${where}: ${elements.length} elements`);
        const ids = elements.map((element) => element.action_id as string);
        if (new Set(ids).size !== ids.length) problems.push(`${where}: repeated action_id`);
        for (const element of elements) {
          const label = textOf(element.text);
          if (label.length === 0 || label.length > 75) problems.push(`${where}: button text length ${label.length}`);
          if (String(element.value).length > 2000) problems.push(`${where}: button value too long`);
          if (String(element.action_id).length > 255) problems.push(`${where}: action_id too long`);
        }
        break;
      }
      default:
        problems.push(`${where}: unexpected block type`);
    }
  });
  return problems;
}

export function discordProblems(encoding: { content: string; embeds: object[]; components: object[] }): string[] {
  const problems: string[] = [];
  if (encoding.content.length > 2000) problems.push(`content ${encoding.content.length} > 2000`);
  if (encoding.embeds.length > 10) problems.push('more than 10 embeds');
  let total = 0;
  for (const embed of encoding.embeds as Json[]) {
    const title = (embed.title as string | undefined) ?? '';
    const description = (embed.description as string | undefined) ?? '';
    const footer = ((embed.footer as Json | undefined)?.text as string | undefined) ?? '';
    const fields = (embed.fields as Json[] | undefined) ?? [];
    if (title.length > 256) problems.push(`title ${title.length}`);
    if (description.length > 4096) problems.push(`description ${description.length}`);
    if (footer.length > 2048) problems.push(`footer ${footer.length}`);
    if (fields.length > 25) problems.push(`${fields.length} fields`);
    total += title.length + description.length + footer.length;
    for (const field of fields) {
      const name = String(field.name);
      const value = String(field.value);
      if (name.length === 0 || name.length > 256) problems.push(`field name length ${name.length}`);
      if (value.length === 0 || value.length > 1024) problems.push(`field value length ${value.length}`);
      total += name.length + value.length;
    }
    if (embed.color !== undefined && (!Number.isInteger(embed.color) || (embed.color as number) < 0 || (embed.color as number) > 0xffffff)) {
      problems.push('colour not a 24-bit integer');
    }
  }
  if (total > 6000) problems.push(`embed text total ${total} > 6000`);
  const rows = encoding.components as Json[];
  if (rows.length > 5) problems.push(`${rows.length} action rows`);
  const customIds: string[] = [];
  for (const row of rows) {
    if (row.type !== 1) problems.push('component row is not type 1');
    const buttons = row.components as Json[];
    if (buttons.length === 0 || buttons.length > 5) problems.push(`${buttons.length} buttons in a row`);
    for (const button of buttons) {
      const label = String(button.label);
      if (label.length === 0 || label.length > 80) problems.push(`button label length ${label.length}`);
      const customId = String(button.custom_id);
      if (customId.length === 0 || customId.length > 100) problems.push(`custom_id length ${customId.length}`);
      customIds.push(customId);
    }
  }
  if (new Set(customIds).size !== customIds.length) problems.push('repeated custom_id');
  return problems;
}

/** True when a string holds an unpaired UTF-16 surrogate (text a platform would mangle or refuse). */
export function hasLoneSurrogate(text: string): boolean {
  return /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(text);
}
