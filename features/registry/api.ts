import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';

import { apiFetch } from '@/features/api';
import { type QueryParams, clean, toSearch } from '@/lib/list-params';
import {
  type ChecklistContentInput,
  type CompanyInput,
  type RideInput,
  type RideListQuery,
  type RidePatch,
  type ScheduleInput,
  type SchedulePatch,
  type SiteInput,
  assignmentListResponseSchema,
  auditListResponseSchema,
  checklistTemplateListResponseSchema,
  checklistTemplateResponseSchema,
  checklistVersionListResponseSchema,
  companyListResponseSchema,
  companyResponseSchema,
  type DesignDecisionBody,
  type DesignPutBody,
  designImportCheckResponseSchema,
  designPendingResponseSchema,
  designResponseSchema,
  designVersionListResponseSchema,
  inspectorListResponseSchema,
  rideDetailResponseSchema,
  rideListPageSchema,
  rideResponseSchema,
  scheduleListResponseSchema,
  scheduleResponseSchema,
  siteListResponseSchema,
  siteResponseSchema,
  timeZoneSettingResponseSchema,
  type InspectionType,
} from '@/features/registry/schema';
import type { RideClass } from '@/features/rides/schema';
import { RIDES_STALE_MS, rideKeys } from '@/features/rides';

export const registryKeys = {
  all: ['registry'] as const,
  companies: () => [...registryKeys.all, 'companies'] as const,
  companyList: (q: QueryParams) => [...registryKeys.companies(), 'list', clean(q)] as const,
  company: (id: string) => [...registryKeys.companies(), 'one', id] as const,
  sites: () => [...registryKeys.all, 'sites'] as const,
  siteList: (q: QueryParams) => [...registryKeys.sites(), 'list', clean(q)] as const,
  site: (id: string) => [...registryKeys.sites(), 'one', id] as const,
  design: (rideId: string) => [...registryKeys.all, 'design', rideId] as const,
  designVersions: (rideId: string) => [...registryKeys.design(rideId), 'versions'] as const,
  designPending: (rideId: string) => [...registryKeys.design(rideId), 'pending'] as const,
  designVersion: (rideId: string, version: number) =>
    [...registryKeys.design(rideId), 'version', version] as const,
  checklists: () => [...registryKeys.all, 'checklists'] as const,
  checklistList: (q: QueryParams) => [...registryKeys.checklists(), 'list', clean(q)] as const,
  checklist: (id: string) => [...registryKeys.checklists(), 'one', id] as const,
  checklistVersions: (id: string) => [...registryKeys.checklist(id), 'versions'] as const,
  checklistVersion: (id: string, version: number) =>
    [...registryKeys.checklist(id), 'version', version] as const,
  schedules: () => [...registryKeys.all, 'schedules'] as const,
  scheduleList: (q: QueryParams) => [...registryKeys.schedules(), 'list', clean(q)] as const,
  rideSchedules: (rideId: string) => [...registryKeys.schedules(), 'ride', rideId] as const,
  myAssignments: () => [...registryKeys.schedules(), 'mine'] as const,
  inspectors: () => [...registryKeys.all, 'inspectors'] as const,
  setups: () => [...registryKeys.all, 'setups'] as const,
  rideSetups: (rideId: string) => [...registryKeys.setups(), 'ride', rideId] as const,
  siteEvents: () => [...registryKeys.setups(), 'events'] as const,
  rounds: () => [...registryKeys.schedules(), 'rounds'] as const,
  roundWeek: (week: string) => [...registryKeys.rounds(), week] as const,
  audit: () => [...registryKeys.all, 'audit'] as const,
  auditList: (q: QueryParams) => [...registryKeys.audit(), 'list', clean(q)] as const,
};

/** The register changes rarely and is edited by few people; a minute keeps screens snappy. */
const REGISTER_STALE_MS = 60 * 1000;
/** Design and template versions never change once made. */
const VERSION_STALE_MS = Infinity;

const enc = encodeURIComponent;

// ——— rides ———

/** One page of rides, filtered, searched and sorted by the server. */
export function useRidePageQuery(query: Partial<RideListQuery>) {
  const params = query as QueryParams;
  return useQuery({
    queryKey: rideKeys.page(clean(params)),
    queryFn: () => apiFetch(`/api/rides${toSearch(params)}`, { schema: rideListPageSchema }),
    staleTime: REGISTER_STALE_MS,
    placeholderData: keepPreviousData,
  });
}

/** Lists, details, schedules (which show ride names and statuses) and the audit log all move together. */
function useInvalidateRegister() {
  const client = useQueryClient();
  return () =>
    Promise.all([
      client.invalidateQueries({ queryKey: rideKeys.all }),
      client.invalidateQueries({ queryKey: registryKeys.all }),
    ]);
}

export function useRideCreateMutation() {
  const invalidate = useInvalidateRegister();
  return useMutation({
    mutationFn: (body: RideInput) => apiFetch('/api/rides', { body, schema: rideResponseSchema }),
    onSuccess: invalidate,
  });
}

export function useRideUpdateMutation(id: string) {
  const invalidate = useInvalidateRegister();
  return useMutation({
    mutationFn: (body: RidePatch) =>
      apiFetch(`/api/rides/${enc(id)}`, { method: 'PATCH', body, schema: rideResponseSchema }),
    onSuccess: invalidate,
  });
}

/** What the register can delete, and the route of each (`DELETE /api/<path>/:id`). */
const deletePaths = {
  company: 'companies',
  site: 'sites',
  ride: 'rides',
  schedule: 'schedules',
  checklist: 'checklist-templates',
  instrument: 'instruments',
  bulletin: 'bulletins',
} as const;
export type RegisterDeletable = keyof typeof deletePaths;

/**
 * Deletes one record of the register (the server keeps its rules: a company with sites, rides or people,
 * a site with rides, a ride with design data, schedules, inspections or notices are refused with 409 and
 * the reason; an instrument goes, since readings keep their own copy of it, and its register, a feature
 * above this one, reads itself anew). Lists, details and the audit log read anew.
 */
export function useRegisterDeleteMutation(kind: RegisterDeletable) {
  const invalidate = useInvalidateRegister();
  const client = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => apiFetch(`/api/${deletePaths[kind]}/${enc(id)}`, { method: 'DELETE' }),
    // The deleted record's own entry is dropped rather than fetched again (a 404 behind the list), and
    // the rest is refreshed without holding up the screen's move back to its list.
    onSuccess: (_res, id) => {
      const own = {
        company: registryKeys.company(id),
        site: registryKeys.site(id),
        ride: rideKeys.detail(id),
        checklist: registryKeys.checklist(id),
        schedule: null,
        instrument: null,
        bulletin: null,
      }[kind];
      if (own) client.removeQueries({ queryKey: own, exact: true });
      void invalidate();
    },
  });
}

// ——— design data ———

export function useDesignVersionsQuery(rideId: string, enabled = true) {
  return useQuery({
    queryKey: registryKeys.designVersions(rideId),
    queryFn: async () =>
      (
        await apiFetch(`/api/rides/${enc(rideId)}/design/versions`, {
          schema: designVersionListResponseSchema,
        })
      ).versions,
    staleTime: REGISTER_STALE_MS,
    enabled,
  });
}

export function useDesignVersionQuery(rideId: string, version: number) {
  return useQuery({
    queryKey: registryKeys.designVersion(rideId, version),
    queryFn: async () =>
      (
        await apiFetch(`/api/rides/${enc(rideId)}/design/versions/${version}`, {
          schema: designResponseSchema,
        })
      ).design,
    staleTime: VERSION_STALE_MS,
    enabled: Number.isInteger(version) && version > 0,
  });
}

type DesignImport = {
  format: 'csv' | 'json';
  content: string;
  reason: string;
  basedOnVersion?: number;
};

/**
 * Checks a design file on the server without saving (`dryRun`): 200 with the data it would become, or
 * 400 `import_invalid` with its row-and-column report.
 */
export function useDesignImportCheckMutation(rideId: string) {
  return useMutation({
    mutationFn: (body: Omit<DesignImport, 'reason'>) =>
      apiFetch(`/api/rides/${enc(rideId)}/design/import?dryRun=true`, {
        body,
        schema: designImportCheckResponseSchema,
      }),
  });
}

/** Imports a design file as a new version; all or nothing. */
export function useDesignImportMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: DesignImport) =>
      apiFetch(`/api/rides/${enc(rideId)}/design/import`, { body, schema: designResponseSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: rideKeys.detail(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.design(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

/**
 * A new version from the field editor (`PUT /api/rides/:id/design`): the server stores it by the same
 * rule as an import (`createDesignVersion`: a loosened limit waits for a second person; 409 when
 * `basedOnVersion` is no longer in force or nothing changed), recorded as made in the editor.
 */
export function useDesignPutMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: DesignPutBody) =>
      apiFetch(`/api/rides/${enc(rideId)}/design`, { method: 'PUT', body, schema: designResponseSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: rideKeys.detail(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.design(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

/** The revision waiting for a second person and the version in force (admins and supervisors). */
export function useDesignPendingQuery(rideId: string, enabled = true) {
  return useQuery({
    queryKey: registryKeys.designPending(rideId),
    queryFn: () =>
      apiFetch(`/api/rides/${enc(rideId)}/design/pending`, { schema: designPendingResponseSchema }),
    staleTime: REGISTER_STALE_MS,
    enabled,
  });
}

/** A second person approves or rejects a pending revision, with a reason. */
export function useDesignDecisionMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ version, ...body }: DesignDecisionBody & { version: number }) =>
      apiFetch(`/api/rides/${enc(rideId)}/design/versions/${version}/decision`, {
        body,
        schema: designResponseSchema,
      }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: rideKeys.detail(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.design(rideId) }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

// ——— companies and sites ———

export function useCompanyListQuery(query: QueryParams = {}, enabled = true) {
  return useQuery({
    queryKey: registryKeys.companyList(query),
    queryFn: () => apiFetch(`/api/companies${toSearch(query)}`, { schema: companyListResponseSchema }),
    staleTime: REGISTER_STALE_MS,
    placeholderData: keepPreviousData,
    enabled,
  });
}

/** The operator companies of a company list (inspection bodies own no rides), as choices. */
export function operatorChoices(
  companies: readonly { id: string; name: string; kind: string }[] | undefined,
): { value: string; label: string }[] {
  return (companies ?? []).filter((c) => c.kind === 'operator').map((c) => ({ value: c.id, label: c.name }));
}

export function useCompanyQuery(id: string | null) {
  return useQuery({
    queryKey: registryKeys.company(id ?? ''),
    queryFn: async () =>
      (await apiFetch(`/api/companies/${enc(id ?? '')}`, { schema: companyResponseSchema })).company,
    enabled: !!id,
    staleTime: REGISTER_STALE_MS,
  });
}

export function useCompanySaveMutation(id: string | null) {
  const invalidate = useInvalidateRegister();
  return useMutation({
    mutationFn: (body: CompanyInput) =>
      id
        ? apiFetch(`/api/companies/${enc(id)}`, { method: 'PATCH', body, schema: companyResponseSchema })
        : apiFetch('/api/companies', { body, schema: companyResponseSchema }),
    onSuccess: invalidate,
  });
}

export function useSiteListQuery(query: QueryParams = {}, enabled = true) {
  return useQuery({
    queryKey: registryKeys.siteList(query),
    queryFn: () => apiFetch(`/api/sites${toSearch(query)}`, { schema: siteListResponseSchema }),
    staleTime: REGISTER_STALE_MS,
    placeholderData: keepPreviousData,
    enabled,
  });
}

export function useSiteQuery(id: string | null) {
  return useQuery({
    queryKey: registryKeys.site(id ?? ''),
    queryFn: async () => (await apiFetch(`/api/sites/${enc(id ?? '')}`, { schema: siteResponseSchema })).site,
    enabled: !!id,
    staleTime: REGISTER_STALE_MS,
  });
}

export function useSiteSaveMutation(id: string | null) {
  const invalidate = useInvalidateRegister();
  return useMutation({
    mutationFn: (body: SiteInput) =>
      id
        ? apiFetch(`/api/sites/${enc(id)}`, { method: 'PATCH', body, schema: siteResponseSchema })
        : apiFetch('/api/sites', { body, schema: siteResponseSchema }),
    onSuccess: invalidate,
  });
}

// ——— checklist templates ———

export function useChecklistListQuery(rideClass?: RideClass, includeArchived = false) {
  const query = { rideClass, includeArchived: includeArchived ? 'true' : undefined };
  return useQuery({
    queryKey: registryKeys.checklistList(query),
    queryFn: async () =>
      (
        await apiFetch(`/api/checklist-templates${toSearch(query)}`, {
          schema: checklistTemplateListResponseSchema,
        })
      ).templates,
    staleTime: REGISTER_STALE_MS,
  });
}

export function useChecklistQuery(id: string, version?: number) {
  return useQuery({
    queryKey: version ? registryKeys.checklistVersion(id, version) : registryKeys.checklist(id),
    queryFn: async () =>
      (
        await apiFetch(
          version
            ? `/api/checklist-templates/${enc(id)}/versions/${version}`
            : `/api/checklist-templates/${enc(id)}`,
          { schema: checklistTemplateResponseSchema },
        )
      ).template,
    staleTime: version ? VERSION_STALE_MS : REGISTER_STALE_MS,
  });
}

export function useChecklistVersionsQuery(id: string) {
  return useQuery({
    queryKey: registryKeys.checklistVersions(id),
    queryFn: async () =>
      (
        await apiFetch(`/api/checklist-templates/${enc(id)}/versions`, {
          schema: checklistVersionListResponseSchema,
        })
      ).versions,
    staleTime: REGISTER_STALE_MS,
  });
}

type ChecklistSave = {
  name: string;
  rideClass: RideClass;
  /** `general`: the class's checklist for any type (stored as no type). */
  inspectionType: InspectionType | 'general';
  content: ChecklistContentInput;
  reason: string;
  basedOnVersion?: number;
};

/** Saving an existing template makes a new version; without an id it creates one. */
export function useChecklistSaveMutation(id: string | null) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ rideClass, inspectionType, ...rest }: ChecklistSave) => {
      const body = { ...rest, inspectionType: inspectionType === 'general' ? null : inspectionType };
      return id
        ? apiFetch(`/api/checklist-templates/${enc(id)}`, {
            method: 'PUT',
            body,
            schema: checklistTemplateResponseSchema,
          })
        : apiFetch('/api/checklist-templates', {
            body: { ...body, rideClass },
            schema: checklistTemplateResponseSchema,
          });
    },
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: registryKeys.checklists() }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

// ——— schedules and assignments ———

export function useScheduleListQuery(query: QueryParams, enabled = true) {
  return useQuery({
    queryKey: registryKeys.scheduleList(query),
    queryFn: () => apiFetch(`/api/schedules${toSearch(query)}`, { schema: scheduleListResponseSchema }),
    staleTime: REGISTER_STALE_MS,
    placeholderData: keepPreviousData,
    enabled,
  });
}

export function useRideSchedulesQuery(rideId: string, enabled = true) {
  return useQuery({
    queryKey: registryKeys.rideSchedules(rideId),
    queryFn: async () =>
      (
        await apiFetch(`/api/rides/${enc(rideId)}/schedules`, {
          schema: z.object({ schedules: scheduleListResponseSchema.shape.schedules }),
        })
      ).schedules,
    staleTime: REGISTER_STALE_MS,
    enabled,
  });
}

export function useMyAssignmentsQuery(enabled = true) {
  return useQuery({
    queryKey: registryKeys.myAssignments(),
    queryFn: async () =>
      (await apiFetch('/api/assignments/mine', { schema: assignmentListResponseSchema })).assignments,
    staleTime: REGISTER_STALE_MS,
    enabled,
  });
}

export function useInspectorsQuery(enabled = true) {
  return useQuery({
    queryKey: registryKeys.inspectors(),
    queryFn: async () =>
      (await apiFetch('/api/inspectors', { schema: inspectorListResponseSchema })).inspectors,
    staleTime: REGISTER_STALE_MS,
    enabled,
  });
}

export function useScheduleCreateMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: ScheduleInput) => apiFetch('/api/schedules', { body, schema: scheduleResponseSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: registryKeys.schedules() }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

export function useScheduleUpdateMutation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: SchedulePatch }) =>
      apiFetch(`/api/schedules/${enc(id)}`, { method: 'PATCH', body: patch, schema: scheduleResponseSchema }),
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: registryKeys.schedules() }),
        client.invalidateQueries({ queryKey: registryKeys.audit() }),
      ]),
  });
}

// ——— audit log ———

/** One page of the audit log (admin, supervisor), newest first unless sorted by `at`. */
export function useAuditQuery(query: QueryParams) {
  return useQuery({
    queryKey: registryKeys.auditList(query),
    queryFn: () => apiFetch(`/api/audit${toSearch(query)}`, { schema: auditListResponseSchema }),
    staleTime: AUDIT_STALE_MS,
    placeholderData: keepPreviousData,
  });
}

/** Every save adds entries; a short stale time keeps the log close to now without refetch storms. */
const AUDIT_STALE_MS = 15 * 1000;

/** The ride seen from the register's side: its entry with the design version in force. */
/**
 * The ride with its current design data. Parsed with the register's schema (which also carries the
 * version's origin) so every screen that shares this cache entry sees the same shape.
 */
export function useRideQuery(id: string | null) {
  return useQuery({
    queryKey: rideKeys.detail(id ?? ''),
    queryFn: () =>
      apiFetch(`/api/rides/${encodeURIComponent(id ?? '')}`, { schema: rideDetailResponseSchema }),
    enabled: !!id,
    staleTime: RIDES_STALE_MS,
  });
}

// ——— the inspection body's default time zone ———

const TIME_ZONE_PATH = '/api/settings/time-zone';

/** The default zone of sites that name none (GET /api/settings/time-zone). */
export function useTimeZoneSettingQuery() {
  return useQuery({
    queryKey: [...registryKeys.all, 'time-zone'] as const,
    queryFn: async () => (await apiFetch(TIME_ZONE_PATH, { schema: timeZoneSettingResponseSchema })).timeZone,
    staleTime: REGISTER_STALE_MS,
  });
}

/** Sets the default zone (admins); sites, rides and schedules read anew, since their days may move. */
export function useTimeZoneSettingMutation() {
  const invalidate = useInvalidateRegister();
  return useMutation({
    mutationFn: (zone: string) =>
      apiFetch(TIME_ZONE_PATH, { method: 'PUT', body: { zone }, schema: timeZoneSettingResponseSchema }),
    onSuccess: invalidate,
  });
}
