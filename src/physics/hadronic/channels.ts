/**
 * Which conversion method applies to which pion-production channel, checked
 * in one place for every path from gamma rays to neutrinos (convert-spectrum,
 * the prediction, the forecast):
 * - the KAB 2006 fit (`kab`) uses pp yields (Kelner, Aharonian & Bugayov 2006,
 *   Phys. Rev. D 74, 034018): pp only;
 * - the K_pi rule (`kpi`, kpiRule.ts) has K_pi = 2 for pp and 1 for p-gamma:
 *   both channels.
 * A p-gamma conversion therefore never uses the pp yields.
 */
import { InputError } from '../../core/errors.js';
import type { PionChannel } from './kpiRule.js';

/** A conversion method: the KAB 2006 proton fit or the K_pi rule. */
export type MethodId = 'kpi' | 'kab';

/** Channels each method applies to. */
export const METHOD_CHANNELS: Readonly<Record<MethodId, readonly PionChannel[]>> = { kab: ['pp'], kpi: ['pp', 'pgamma'] };

/** Default methods of a channel, primary first: pp ['kab', 'kpi'], p-gamma ['kpi']. */
export function defaultMethods(channel: PionChannel): MethodId[] {
  return channel === 'pp' ? ['kab', 'kpi'] : ['kpi'];
}

/** Throws InputError when `method` does not apply to `channel` (or is unknown). */
export function checkMethodChannel(method: MethodId, channel: PionChannel, keyPath = 'methods'): void {
  const ok = METHOD_CHANNELS[method];
  if (!ok) throw new InputError(`unknown conversion method "${String(method)}"`, { keyPath }, 'use kab or kpi');
  if (!ok.includes(channel)) {
    throw new InputError(`conversion method ${method} applies to ${ok.join(', ')} only, not ${channel}`, { keyPath },
      channel === 'pgamma' ? 'use the K_pi rule (kpi) for p-gamma' : `use ${defaultMethods(channel).join(' or ')}`);
  }
}

/** Words for the assumption texts: "pp collisions" or "p-gamma interactions". */
export function channelWords(channel: PionChannel): string {
  return channel === 'pp' ? 'pp collisions' : 'p-gamma interactions';
}
