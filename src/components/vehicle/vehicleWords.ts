import type { VehicleKind, VehicleRole } from '@shared/schemas/vehicles'

export const KIND_LABELS: Record<VehicleKind, { label: string; icon: string }> = {
  van: { label: 'Van', icon: 'airport_shuttle' },
  motorhome: { label: 'Motorhome', icon: 'rv_hookup' },
  boat: { label: 'Boat', icon: 'sailing' },
  trailer: { label: 'Trailer', icon: 'rv_hookup' },
  cabin: { label: 'Cabin', icon: 'cabin' },
}

export const ROLE_LABELS: Record<VehicleRole, string> = {
  owner: 'Owner',
  editor: 'Editor',
  viewer: 'Viewer',
  advisor: 'Advisor',
}

/** "3 Dec, 14:05" in the browser's locale. */
export function shortDateTime(iso: string | null | undefined): string {
  if (!iso) return ''
  return new Date(iso).toLocaleString([], {
    day: 'numeric',
    month: 'short',
    hour: '2-digit',
    minute: '2-digit',
  })
}
