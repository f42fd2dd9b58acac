/**
 * Reads the messages the local mail catcher wrote into DEV_MAIL_DIR (one JSON file each, named
 * `<time>-<id>.json`). Only the development-only /api/dev/mail route uses this.
 */
import fs from 'node:fs/promises';
import path from 'node:path';
import { DevMailSchema, type DevMail } from '@shared/api/dev-mail';

export async function readMailbox(dir: string): Promise<DevMail[]> {
  let files: string[];
  try {
    files = (await fs.readdir(dir)).filter((f) => f.endsWith('.json'));
  } catch {
    return [];
  }
  files.sort().reverse();
  const out: DevMail[] = [];
  for (const f of files) {
    try {
      const parsed = DevMailSchema.safeParse(JSON.parse(await fs.readFile(path.join(dir, f), 'utf8')));
      if (parsed.success) out.push(parsed.data);
    } catch {
      /* a file still being written or not ours: skip it */
    }
  }
  return out;
}
