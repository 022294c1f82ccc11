/**
 * The first-run steps of a new organization, ticked off from what the data shows: a key exists; a
 * metered call has been counted (this month's usage, or a key that has been used); a widget is embedded
 * (an embed key exists, or an embed key's calls were counted).
 */
import type { ApiKeyView, ConsoleUsage } from '#shared/schemas/keys.ts';

export interface FirstRunStep {
  id: 'create-key' | 'first-call' | 'embed-widget';
  title: string;
  description: string;
  done: boolean;
  action: { to: string; label: string };
}

export function firstRunSteps(keys: readonly ApiKeyView[], usage: Pick<ConsoleUsage, 'used' | 'byKey'>): FirstRunStep[] {
  const embedIds = new Set(keys.filter((k) => k.kind === 'embed').map((k) => k.id));
  return [
    {
      id: 'create-key',
      title: 'Create a key',
      description: 'A server key for your own software; the playground runs its calls under it.',
      done: keys.length > 0,
      action: { to: '/keys', label: 'Go to Keys' },
    },
    {
      id: 'first-call',
      title: 'Make a first call from the playground',
      description: 'Run any calculation: it is a real, metered call, and it shows in Usage.',
      done: usage.used > 0 || keys.some((k) => k.lastUsedAt !== null),
      action: { to: '/playground/pack-energy', label: 'Open the playground' },
    },
    {
      id: 'embed-widget',
      title: 'Embed a widget',
      description: 'Put a calculator on your own site with an embed key that works only there.',
      done: embedIds.size > 0 || usage.byKey.some((k) => embedIds.has(k.keyId) && k.calls > 0),
      action: { to: '/widgets', label: 'Go to Widgets' },
    },
  ];
}
