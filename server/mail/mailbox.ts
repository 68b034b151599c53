import { promises as fs } from 'node:fs';
import path from 'node:path';
import { parseEml, type ParsedMail } from './eml';

/** A caught message in the list (without its bodies). */
export interface CaughtMailSummary {
  id: string;
  to: string;
  subject: string;
  date: string;
}

const NAME = /^[0-9A-Za-z-]+\.eml$/;

/** The messages the local catcher wrote to `dir`, newest first (at most `limit`). */
export async function listCaught(dir: string, limit = 200): Promise<CaughtMailSummary[]> {
  let names: string[];
  try {
    names = (await fs.readdir(dir)).filter((n) => NAME.test(n));
  } catch {
    return [];
  }
  // Names start with an ISO time and end with a counter: sort by both, newest first.
  names.sort((a, b) => b.localeCompare(a, 'en', { numeric: true }));
  const out: CaughtMailSummary[] = [];
  for (const name of names.slice(0, limit)) {
    const mail = parseEml(await fs.readFile(path.join(dir, name), 'utf8'));
    out.push({
      id: name.replace(/\.eml$/, ''),
      to: mail.to,
      subject: mail.subject,
      date: mail.date,
    });
  }
  return out;
}

/** One caught message, or null when there is none with this id. */
export async function readCaught(dir: string, id: string): Promise<ParsedMail | null> {
  const name = `${id}.eml`;
  if (!NAME.test(name)) return null;
  try {
    return parseEml(await fs.readFile(path.join(dir, name), 'utf8'));
  } catch {
    return null;
  }
}
