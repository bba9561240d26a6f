/**
 * The list of commands. Each command module exports `register(program, io)`;
 * add one import and one call per command, nothing else.
 */
import type { Command } from 'commander';
import type { CliIo } from '../main.js';

export function registerCommands(program: Command, io: CliIo): void {
  void program; void io;
  // commands register here, one line each
}
