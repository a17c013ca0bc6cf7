import type { Mutation, MutationType } from '@benchtide/shared';

const WORDS: Readonly<Record<MutationType, string>> = {
  'build.create': 'New build',
  'build.patch': 'Build edited',
  'build.delete': 'Build deleted',
  'step.create': 'Step logged',
  'step.patch': 'Step edited',
  'step.delete': 'Step deleted',
  'material.create': 'Material added to the shelf',
  'material.patch': 'Material edited',
  'material.delete': 'Material removed from the shelf',
  'container.create': 'Container added to the shelf',
  'container.patch': 'Container edited',
  'container.delete': 'Container removed from the shelf',
  'container.waste': 'Waste recorded',
  'container.stocktake': 'Stocktake recorded',
  'pour.create': 'Pour logged',
  'pour.delete': 'Pour deleted',
  'photo.patch': 'Photo caption changed',
  'photo.delete': 'Photo deleted',
};

/** A queued change in the modeller's words: what it does, and the name or title it carries, if any. */
export function describeChange(mutation: Mutation): string {
  const words = WORDS[mutation.type];
  const data = 'data' in mutation ? (mutation.data as { name?: unknown; title?: unknown }) : {};
  const label = typeof data.name === 'string' ? data.name : typeof data.title === 'string' ? data.title : '';
  return label === '' ? words : `${words}: ${label}`;
}
