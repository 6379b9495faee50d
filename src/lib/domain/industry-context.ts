/**
 * The industry contexts a process can belong to. Each later carries the capability it requires
 * (the target profiles); here they are the names and ids every record refers to.
 */
export const BUILT_IN_CONTEXTS = [
  { id: 'vehicle-parts', label: 'Vehicle parts' },
  { id: 'aerospace-parts', label: 'Aerospace parts' },
  { id: 'medical-devices', label: 'Medical devices' },
  { id: 'semiconductors', label: 'Semiconductors' },
  { id: 'packaged-goods', label: 'Packaged goods, net content' },
  { id: 'transactional-service', label: 'Transactional and service work' }
] as const;

export type BuiltInContextId = (typeof BUILT_IN_CONTEXTS)[number]['id'];

export function contextLabel(id: string): string {
  return BUILT_IN_CONTEXTS.find((c) => c.id === id)?.label ?? id;
}
