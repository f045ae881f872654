/**
 * Runs Debian's poppler-utils (pdftotext, pdfinfo, pdftoppm, pdfimages) on a PDF. The
 * test command installs them; a missing tool fails the test with a sentence
 * saying so rather than skipping it.
 */
import { execFileSync } from 'node:child_process';

export function runPoppler(tool: 'pdftotext' | 'pdfinfo' | 'pdftoppm' | 'pdfimages', args: string[]): string {
  try {
    return execFileSync(tool, args, { encoding: 'utf8', maxBuffer: 32 * 1024 * 1024 });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') {
      throw new Error(`${tool} is missing: install Debian's poppler-utils (npm test installs it).`);
    }
    throw error;
  }
}

/** The text of each page, from `pdftotext -layout` (pages end with a form feed). */
export function pdfPagesText(pdfPath: string): string[] {
  const text = runPoppler('pdftotext', ['-layout', '-enc', 'UTF-8', pdfPath, '-']);
  const pages = text.split('\f');
  if (pages[pages.length - 1].trim() === '') pages.pop();
  return pages;
}

export function pdfPageCount(pdfPath: string): number {
  const match = /^Pages:\s+(\d+)$/m.exec(runPoppler('pdfinfo', [pdfPath]));
  if (!match) throw new Error(`pdfinfo printed no page count for ${pdfPath}`);
  return Number(match[1]);
}

/** Collapses the layout's runs of spaces and line breaks (and no-break spaces) to single spaces. */
export function flowText(text: string): string {
  return text.replace(/[\s\u00A0]+/g, ' ').trim();
}
