/**
 * Reading a template spec file from disk.
 */
import { readFileSync } from 'node:fs';
import { InputError } from '../core/errors.js';
import { parseTemplateSpec, type TemplateSpec } from './templateSpec.js';

/** Reads and checks the YAML/JSON spec at `path` (InputError naming the file on any problem). */
export function readTemplateSpec(path: string): TemplateSpec {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new InputError(`cannot read: ${(e as NodeJS.ErrnoException).code ?? String(e)}`, { file: path }, 'check the path of the spec file');
  }
  return parseTemplateSpec(text, path);
}
