import { existsSync } from 'node:fs';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { CapturedMail } from '../../shared/contracts/team';
import type { StoredMail } from './mail-catcher';

/** The messages the catcher kept for one shop, newest first (at most `limit`). */
export async function readCapturedMail(
  dir: string,
  shopId: string,
  limit = 50,
): Promise<CapturedMail[]> {
  if (!existsSync(dir)) return [];
  const names = (await readdir(dir))
    .filter((name) => name.endsWith('.json'))
    .sort()
    .reverse();
  const result: CapturedMail[] = [];
  for (const name of names) {
    if (result.length >= limit) break;
    const mail = JSON.parse(await readFile(join(dir, name), 'utf8')) as StoredMail;
    if (mail.shopId !== shopId) continue;
    const { shopId: _shop, ...visible } = mail;
    result.push(visible);
  }
  return result;
}
