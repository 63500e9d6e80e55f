import { readFileSync, readSync, statSync } from 'node:fs';
import { studyDocumentSchema } from '@laminote/contracts';
import { analyzeCase, CaseError } from './analyze';
import { computeStudy } from './cells/study';

/**
 * Command line:
 * - `npm run --silent aero -- analyze case.json` analyses one engine case and prints the result;
 * - `npm run --silent aero -- study study.json` computes every cell of a study document (as the
 *   notebook exports it) from its inputs, in dependency order, and prints the document with fresh
 *   outputs: the server's stored ones, reproduced without the server.
 * `-` reads standard input. Output is JSON on standard output, exit 0. Bad input exits 2 with one
 * plain line on standard error naming the field or table line; nothing is written to standard output
 * then. An internal failure exits 1, also with one line.
 */

/** Largest case accepted, in bytes. */
const MAX_INPUT_BYTES = 32 * 1024 * 1024;
const USAGE = 'usage: aero analyze <case.json | -> | aero study <study.json | -> (at most 32 MiB)';

class InputError extends Error {}

function readInput(source: string): string {
  if (source === '-') {
    const chunks: Buffer[] = [];
    let total = 0;
    const buffer = Buffer.alloc(1 << 16);
    for (;;) {
      let count: number;
      try {
        count = readSyncStdin(buffer);
      } catch (error) {
        throw new InputError(`standard input: cannot read (${errorText(error)})`);
      }
      if (count === 0) break;
      total += count;
      if (total > MAX_INPUT_BYTES) throw new InputError(`standard input: larger than the ${MAX_INPUT_BYTES / 1024 / 1024} MiB limit`);
      chunks.push(Buffer.from(buffer.subarray(0, count)));
    }
    return Buffer.concat(chunks).toString('utf8');
  }
  let size: number;
  try {
    size = statSync(source).size;
  } catch (error) {
    throw new InputError(`${source}: cannot read (${errorText(error)})`);
  }
  if (size > MAX_INPUT_BYTES) throw new InputError(`${source}: larger than the ${MAX_INPUT_BYTES / 1024 / 1024} MiB limit`);
  try {
    return readFileSync(source, 'utf8');
  } catch (error) {
    throw new InputError(`${source}: cannot read (${errorText(error)})`);
  }
}

function readSyncStdin(buffer: Buffer): number {
  for (;;) {
    try {
      return readSync(0, buffer);
    } catch (error) {
      // A non-blocking standard input (a terminal or some pipes) may say "try again"; wait for data.
      if ((error as NodeJS.ErrnoException).code === 'EAGAIN') {
        Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 10);
        continue;
      }
      if ((error as NodeJS.ErrnoException).code === 'EOF') return 0;
      throw error;
    }
  }
}

function errorText(error: unknown): string {
  const text = error instanceof Error ? ((error as NodeJS.ErrnoException).code ?? error.message) : String(error);
  return oneLine(text);
}

function oneLine(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/** Parse JSON, turning the parser's position into a line and column. */
function parseJson(text: string, source: string): unknown {
  try {
    return JSON.parse(text);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const position = /position (\d+)/.exec(message);
    if (position !== null) {
      const offset = Number(position[1]);
      const before = text.slice(0, offset);
      const line = before.split('\n').length;
      const column = offset - before.lastIndexOf('\n');
      throw new InputError(`${source}: malformed JSON at line ${line}, column ${column} (${oneLine(message.replace(/ in JSON at position \d+.*$/, ''))})`);
    }
    throw new InputError(`${source}: malformed JSON (${oneLine(message)})`);
  }
}

/** A study document, or the first problem with it named by its path (`cells[3].inputs`). */
function readStudy(json: unknown, label: string) {
  const parsed = studyDocumentSchema.safeParse(json);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0]!;
  const path = issue.path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${String(key)}` : String(key)), '');
  throw new InputError(`${label}: ${path ? `${path}: ` : ''}${issue.message} (not a Laminote study document?)`);
}

function main(args: readonly string[]): number {
  if (args.length !== 2 || (args[0] !== 'analyze' && args[0] !== 'study')) {
    process.stderr.write(`${USAGE}\n`);
    return 2;
  }
  const source = args[1];
  const label = source === '-' ? 'standard input' : source;
  try {
    const text = readInput(source);
    if (text.trim() === '') throw new InputError(`${label}: empty input; nothing to analyse`);
    const json = parseJson(text, label);
    const result = args[0] === 'analyze' ? analyzeCase(json) : computeStudy(readStudy(json, label));
    process.stdout.write(`${JSON.stringify(result)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof InputError) {
      process.stderr.write(`${oneLine(error.message)}\n`);
      return 2;
    }
    if (error instanceof CaseError) {
      process.stderr.write(`${oneLine(error.message)}\n`);
      return 2;
    }
    process.stderr.write(`internal error: ${oneLine(error instanceof Error ? error.message : String(error))}\n`);
    return 1;
  }
}

process.exitCode = main(process.argv.slice(2));
