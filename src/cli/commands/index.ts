/**
 * The list of commands. Each command module exports `register(program, io)`;
 * add one import and one call per command, nothing else.
 */
import type { Command } from 'commander';
import type { CliIo } from '../main.js';
import { register as registerInfo } from './info.js';
import { register as registerRemap } from './remap.js';
import { register as registerFactors } from './factors.js';
import { register as registerBuild } from './build.js';
import { register as registerMask } from './mask.js';
import { register as registerDraw } from './draw.js';
import { register as registerConvertSpectrum } from './convertSpectrum.js';
import { register as registerCompare } from './compare.js';
import { register as registerExpectGamma } from './expectGamma.js';
import { register as registerSources } from './sources.js';
import { register as registerRun } from './run.js';
import { register as registerMergeFactors } from './mergeFactors.js';

export function registerCommands(program: Command, io: CliIo): void {
  void program; void io;
  // commands register here, one line each
  registerInfo(program, io);
  registerRemap(program, io);
  registerFactors(program, io);
  registerBuild(program, io);
  registerMask(program, io);
  registerDraw(program, io);
  registerConvertSpectrum(program, io);
  registerCompare(program, io);
  registerExpectGamma(program, io);
  registerSources(program, io);
  registerRun(program, io);
  registerMergeFactors(program, io);
}
