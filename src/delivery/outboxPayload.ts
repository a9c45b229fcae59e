/**
 * The outbox row's payload: a rendered Message made JSON-safe. Images travel base64-encoded
 * (an alert's chart is a few tens of kilobytes); an image larger than `MAX_IMAGE_BYTES` is dropped
 * with a line saying so, because the text and the footer are what must arrive. The safety footer
 * travels with the message and is checked again when the row is read back.
 */
import { z } from 'zod';
import { ACTION_IDS, type Message } from '../render/message.ts';
import { footerOf } from '../render/safetyFooter.ts';

export const OUTBOX_PAYLOAD_VERSION = 1;

/** Largest PNG kept in a queued message; bigger ones are dropped (the row would bloat the table). */
export const MAX_IMAGE_BYTES = 512 * 1024;

const actionIdSchema = z.enum(ACTION_IDS);

const payloadSchema = z.object({
  v: z.literal(OUTBOX_PAYLOAD_VERSION),
  message: z.object({
    kind: z.enum(['lookup', 'alert', 'summary', 'detail', 'help', 'notice', 'error']),
    title: z.string(),
    sections: z.array(
      z.object({
        heading: z.string().optional(),
        lines: z.array(z.string()),
        fields: z.array(z.object({ label: z.string(), value: z.string() })).optional(),
      }),
    ),
    table: z.object({ columns: z.array(z.string()), rows: z.array(z.array(z.string())) }).optional(),
    images: z.array(z.object({ fileName: z.string(), altText: z.string(), pngBase64: z.string() })),
    actions: z.array(z.object({ actionId: actionIdSchema, label: z.string(), value: z.string() })),
    severity: z.enum(['info', 'watch', 'warning']),
    inventedData: z.boolean(),
    footer: z.string(),
  }),
});

export type OutboxPayload = z.infer<typeof payloadSchema>;

export function messageToPayload(message: Message): OutboxPayload {
  const kept = message.images.filter((image) => image.png.byteLength <= MAX_IMAGE_BYTES);
  const dropped = message.images.length - kept.length;
  const sections = dropped === 0
    ? message.sections
    : [...message.sections, { lines: [`(${dropped} image${dropped === 1 ? '' : 's'} too large to queue; ask for the chart with the command)`] }];
  return {
    v: OUTBOX_PAYLOAD_VERSION,
    message: {
      kind: message.kind,
      title: message.title,
      sections: sections.map((s) => ({ ...(s.heading !== undefined ? { heading: s.heading } : {}), lines: [...s.lines], ...(s.fields ? { fields: s.fields.map((f) => ({ ...f })) } : {}) })),
      ...(message.table ? { table: { columns: [...message.table.columns], rows: message.table.rows.map((r) => [...r]) } } : {}),
      images: kept.map((image) => ({ fileName: image.fileName, altText: image.altText, pngBase64: Buffer.from(image.png).toString('base64') })),
      actions: message.actions.map((a) => ({ ...a })),
      severity: message.severity,
      inventedData: message.inventedData,
      footer: footerOf(message),
    },
  };
}

export type DecodedPayload = { ok: true; message: Message } | { ok: false; reason: string };

/** Reads a row's payload back; a payload that does not parse is reported, never posted half-read. */
export function payloadToMessage(payload: unknown): DecodedPayload {
  const parsed = payloadSchema.safeParse(payload);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, reason: `outbox payload unreadable at ${issue?.path.join('.') || '(root)'}: ${issue?.message ?? 'invalid'}` };
  }
  const m = parsed.data.message;
  const message: Message = {
    kind: m.kind,
    title: m.title,
    sections: m.sections,
    ...(m.table ? { table: m.table } : {}),
    images: m.images.map((image) => ({ fileName: image.fileName, altText: image.altText, png: new Uint8Array(Buffer.from(image.pngBase64, 'base64')) })),
    actions: m.actions,
    severity: m.severity,
    inventedData: m.inventedData,
    footer: m.footer,
  };
  // The footer is restored if a stored payload lost it: no message leaves without it.
  message.footer = footerOf(message);
  return { ok: true, message };
}
