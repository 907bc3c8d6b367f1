import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { docsPath, regeneratedDocs } from './support/cliDocs.js';

describe('docs/cli.md', () => {
  it('holds the command reference exactly as generated from the option tables', async () => {
    const current = readFileSync(docsPath, 'utf8');
    expect(current, 'docs/cli.md is out of date: run pnpm --filter bridgework docs:cli').toBe(
      await regeneratedDocs(),
    );
  });

  it('states the exit codes and the safety caution', () => {
    const docs = readFileSync(docsPath, 'utf8');
    expect(docs).toMatch(/\| *`0` *\|/);
    expect(docs).toMatch(/\| *`2` *\|/);
    expect(docs).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });
});
