/**
 * The table of commands (src/cli/commands/index.ts): each entry's module
 * registers a command of the entry's name whose description is the entry's
 * summary (so `skyspan --help`, which lists the table without importing the
 * modules, says what each command's own help says), and `runCli` runs a
 * command and its help through the table. Project rule, no outside source.
 */
import { Command } from 'commander';
import { describe, expect, it } from 'vitest';
import { COMMANDS, findCommand } from '../../src/cli/commands/index.js';
import { runCli } from '../../src/cli/main.js';

const silent = { out: () => {}, err: () => {} };

describe('the command table', () => {
  it('has unique names', () => {
    expect(new Set(COMMANDS.map((c) => c.name)).size).toBe(COMMANDS.length);
  });

  it.each(COMMANDS.map((c) => [c.name, c] as const))('%s: the module registers that name with the summary as description', async (_name, c) => {
    const program = new Command();
    (await c.load()).register(program, silent);
    expect(program.commands.map((x) => x.name())).toEqual([c.name]);
    expect(program.commands[0].description()).toBe(c.summary);
  });

  it('finds the command after the program options and after help', () => {
    expect(findCommand(['--debug', 'remap', 'a.fits', 'b.fits'])?.name).toBe('remap');
    expect(findCommand(['help', 'convert-spectrum'])?.name).toBe('convert-spectrum');
    expect(findCommand(['--help'])).toBeUndefined();
    expect(findCommand(['infoo'])).toBeUndefined();
  });

  it('runCli shows a command\'s own help (its options) through the table', async () => {
    let out = '';
    const code = await runCli(['remap', '--help'], { out: (t) => { out += t; }, err: () => {} });
    expect(code).toBe(0);
    expect(out).toContain('Usage: skyspan remap [options] <in> <out>');
    expect(out).toContain('--ordering <scheme>');
  });
});
