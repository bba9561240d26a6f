/**
 * Reading a template spec file from disk.
 */
import { readInputText } from '../io/inputFile.js';
import { parseTemplateSpec, type TemplateSpec } from './templateSpec.js';

/** Reads and checks the YAML/JSON spec at `path` (InputError naming the file on any problem). */
export function readTemplateSpec(path: string): TemplateSpec {
  return parseTemplateSpec(readInputText(path), path);
}
