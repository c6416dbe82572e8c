import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import type { OutboxMessage, OutboxMessageSummary } from '@shared/api/outbox.ts';

/** Reads the .eml files the SMTP sink keeps. Ids are file names without ".eml". */
const ID_PATTERN = /^[A-Za-z0-9-]{1,100}$/;

export const isOutboxId = (id: string) => ID_PATTERN.test(id);

const addresses = (field: AddressObject | AddressObject[] | undefined): string[] =>
  (Array.isArray(field) ? field : field ? [field] : []).flatMap((a) => a.value.map((v) => v.address ?? v.name));

async function parseFile(directory: string, id: string): Promise<OutboxMessage> {
  const mail = await simpleParser(await readFile(path.join(directory, `${id}.eml`)));
  return {
    id,
    to: addresses(mail.to),
    from: addresses(mail.from).join(', '),
    subject: mail.subject ?? '',
    receivedAt: (mail.date ?? new Date()).toISOString(),
    text: mail.text ?? '',
    html: typeof mail.html === 'string' ? mail.html : null,
  };
}

export async function listOutbox(directory: string): Promise<OutboxMessageSummary[]> {
  let files: string[];
  try {
    files = await readdir(directory);
  } catch {
    return [];
  }
  const ids = files.filter((f) => f.endsWith('.eml')).map((f) => f.slice(0, -4)).filter(isOutboxId).sort().reverse();
  const messages = await Promise.all(ids.map((id) => parseFile(directory, id)));
  return messages.map(({ text: _text, html: _html, ...summary }) => summary);
}

/** One message, or null when there is no such file. */
export async function readOutboxMessage(directory: string, id: string): Promise<OutboxMessage | null> {
  if (!isOutboxId(id)) return null;
  try {
    return await parseFile(directory, id);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw error;
  }
}
