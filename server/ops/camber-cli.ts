// `npm run camber -- predict <file.json>` (or `-` for standard input): prints the prediction as JSON.
import { readFileSync } from 'node:fs';
import { ZodError } from 'zod';
import { predict } from '#shared/camber/predict';

const USAGE = 'usage: npm run camber -- predict <file.json | ->';

function readInput(arg: string): unknown {
  const text = arg === '-' ? readFileSync(0, 'utf8') : readFileSync(arg, 'utf8');
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new Error(`${arg === '-' ? 'standard input' : arg} is not valid JSON: ${(e as Error).message}`);
  }
}

function main(argv: string[]): number {
  const [cmd, file] = argv;
  if (cmd !== 'predict' || !file) {
    console.error(USAGE);
    return 2;
  }
  try {
    const result = predict(readInput(file));
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
    return 0;
  } catch (e) {
    if (e instanceof ZodError) {
      for (const i of e.issues) console.error(`${i.path.join('.') || '(input)'}: ${i.message}`);
      return 1;
    }
    console.error(e instanceof Error ? e.message : String(e));
    return 1;
  }
}

process.exit(main(process.argv.slice(2)));
