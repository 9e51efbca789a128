import { randomUUID } from 'node:crypto';
import { basename } from 'node:path';

/*
 * An inbox file's name says where it came from, and nothing in it comes from inside the object:
 * a random UUID, then for a watched file "--" and the exported file's name, for a received one "@"
 * and the calling AE title in hexadecimal (an AE title may hold characters no file name should).
 */
const UUID_LENGTH = 36;
const WATCHED = '--';
const RECEIVED = '@';

/** The inbox name of a file taken from the watched folder: unique, and still naming the exported file. */
export const inboxNameFor = (exported: string): string => `${randomUUID()}${WATCHED}${basename(exported)}`;

/** The inbox name of an object received from a calling AE title. */
export const receivedName = (callingAeTitle: string): string =>
  `${randomUUID()}${RECEIVED}${Buffer.from(callingAeTitle, 'latin1').toString('hex')}.dcm`;

/** Where an inbox file came from: the name to show (the exported file's, or the inbox's), and for a received object its sender. */
export function arrivalOf(inboxName: string): { readonly fileName: string; readonly received: boolean; readonly callingAeTitle?: string } {
  const name = basename(inboxName);
  if (name.indexOf(WATCHED) === UUID_LENGTH) return { fileName: name.slice(UUID_LENGTH + WATCHED.length), received: false };
  const sender = new RegExp(`^.{${UUID_LENGTH}}${RECEIVED}((?:[0-9a-f]{2})+)\\.dcm$`).exec(name);
  if (sender) return { fileName: name, received: true, callingAeTitle: Buffer.from(sender[1]!, 'hex').toString('latin1') };
  return { fileName: name, received: false };
}

/** The exported file's own name from its inbox name (the receiver's names are kept as they are). */
export const originalName = (inboxName: string): string => arrivalOf(inboxName).fileName;
