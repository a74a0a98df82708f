/**
 * The save panel's id and title follow the code: while the code is the loaded example's, they are
 * the example's; once it changes, they name a new property beside it (saving must never put other
 * code under a shipped property's id). A value the user typed wins over both.
 */
import type { PropertyExample } from './examples.ts';

export type FollowedName = { id: string; title: string };

const EDITED_ID_SUFFIX = '-edited';
const EDITED_TITLE_SUFFIX = ' (edited)';

/** Code equal but for trailing spaces and line endings counts as unchanged. */
const normalised = (code: string) =>
  code
    .replace(/\r\n/g, '\n')
    .replace(/[ \t]+$/gm, '')
    .trim();

export function nameForCode(example: Pick<PropertyExample, 'id' | 'title' | 'code' | 'origin'>, code: string, blank: boolean): FollowedName {
  if (blank || normalised(code) === normalised(example.code)) return { id: example.id, title: example.title };
  return { id: `${example.id}${EDITED_ID_SUFFIX}`, title: `${example.title}${EDITED_TITLE_SUFFIX}` };
}
