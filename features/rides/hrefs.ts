/**
 * Links to a ride's pages. Every ride page lives under `/rides/…`, whichever feature draws it (the ride
 * page; the register's edit, status, design, import and schedule screens), so the links are built here, in
 * the lowest feature all of those may import. `satisfies Href` has tsc check each against `app/` (typed
 * routes) while the value stays a plain path string (usable as a key or a prefix).
 */
import type { Href } from 'expo-router';

const ride = (id: string) => `/rides/${encodeURIComponent(id)}` as const;

export const ridesHref = '/rides' as const satisfies Href;
export const newRideHref = '/rides/new' as const satisfies Href;
export const rideHref = (id: string) => ride(id) satisfies Href;
export const rideEditHref = (id: string) => `${ride(id)}/edit` as const satisfies Href;
export const rideStatusHref = (id: string) => `${ride(id)}/status` as const satisfies Href;
export const rideDesignHref = (id: string) => `${ride(id)}/design` as const satisfies Href;
export const rideVersionHref = (id: string, version: number) =>
  `${ride(id)}/versions/${version}` as const satisfies Href;
export const rideImportHref = (id: string) => `${ride(id)}/import` as const satisfies Href;
export const rideDesignEditHref = (id: string) => `${ride(id)}/edit-design` as const satisfies Href;
export const rideScheduleHref = (id: string) => `${ride(id)}/schedule` as const satisfies Href;
export const rideLogHref = (id: string) => `${ride(id)}/log` as const satisfies Href;
export const rideNdtHref = (id: string) => `${ride(id)}/ndt` as const satisfies Href;
export const rideLogbookHref = (id: string) => `${ride(id)}/logbook` as const satisfies Href;
export const rideIncidentsHref = (id: string) => `${ride(id)}/incidents` as const satisfies Href;
export const rideIncidentNewHref = (id: string) => `${ride(id)}/incidents/new` as const satisfies Href;
export const ridePartsHref = (id: string) => `${ride(id)}/parts` as const satisfies Href;
