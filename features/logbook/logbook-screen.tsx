import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { DateField } from '@/components/date-field';
import Feather from '@/components/feather-icon';
import { FilterGroup, FilterGroups, FilterPanel } from '@/components/filter-panel';
import { PagedList } from '@/components/paged-list';
import { SearchField } from '@/components/search-field';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { ToggleChips } from '@/components/toggle-chips';
import { useListParams, useSearchText } from '@/components/use-list-params';
import { useWide } from '@/components/use-wide';
import {
  downloadPdf,
  fileTypes,
  handOverVerb,
  PaperSizeDownload,
  pdfFileName,
  saveOrShareApiFile,
} from '@/features/api/ui';
import { RoleGate } from '@/features/auth/ui';
import { logbookCsvPath, logbookPdfPath, useLogbookQuery } from '@/features/logbook/api';
import { filterWords } from '@/features/logbook/filter-words';
import { LogbookEntry, logbookKindIcon } from '@/features/logbook/logbook-entry';
import {
  logbookKinds,
  logbookKindWords,
  logbookQuerySchema,
  type LogbookFilter,
  type LogbookKind,
} from '@/features/logbook/schema';
import { RideNotFound, useRideIdParam } from '@/features/registry/ui';
import { rideHref } from '@/features/rides';
import type { Role } from '@/features/session/schema';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';

const LIST_KEYS = ['kinds', 'from', 'to', 'q', 'page'] as const;

/** The kinds a role's logbook can hold (the server decides; this only keeps useless chips away). */
const kindsFor = (role: Role): readonly LogbookKind[] =>
  role === 'operator'
    ? logbookKinds.filter((k) => !['inspection', 'decision', 'design'].includes(k))
    : logbookKinds;

/**
 * Everything that happened to one ride, newest first: inspections, decisions, findings, corrective
 * actions, notices, NDT, design data and status, incident reports, parts replaced, set-ups, daily checks
 * and makers' bulletins. Filter by kind, site days and words; download what the
 * filter keeps (every page) as a PDF or a CSV file. Each entry leads to where it lives in the app.
 */
export function LogbookScreen() {
  const id = useRideIdParam();
  return (
    <RoleGate roles={['admin', 'supervisor', 'inspector', 'operator']}>
      {(user) => <Logbook rideId={id} role={user.role} />}
    </RoleGate>
  );
}

function Logbook({ rideId, role }: { rideId: string; role: Role }) {
  const wide = useWide();
  const [query, setQuery] = useListParams(logbookQuerySchema, LIST_KEYS);
  const book = useLogbookQuery(rideId, query);
  const filter = (patch: Parameters<typeof setQuery>[0]) => setQuery({ ...patch, page: undefined });
  const [search, setSearch] = useSearchText(query.q, (q) => filter({ q }));
  const back = { href: rideHref(rideId), label: 'Ride' };
  if (book.error instanceof ApiRequestError && book.error.status === 404) return <RideNotFound back={back} />;
  const ride = book.data?.ride;
  const { page: _page, ...current } = query;
  const kinds = kindsFor(role);

  return (
    <SubScreen
      title="Logbook"
      subtitle={ride ? `${ride.name} · ${ride.siteName ?? 'No site'} · ${ride.operatorName}` : undefined}
      back={back}
    >
      <FilterPanel
        active={(query.kinds?.length ?? 0) + (query.from ? 1 : 0) + (query.to ? 1 : 0)}
        search={
          <SearchField
            label="Search the logbook"
            placeholder="Words in an entry or a name"
            value={search}
            onChangeText={setSearch}
          />
        }
        beside={
          <>
            <View style={wide ? styles.flex : undefined}>
              <DateField
                label="From"
                value={query.from ?? null}
                max={query.to ?? undefined}
                onChange={(day) => filter({ from: day ?? undefined })}
              />
            </View>
            <View style={wide ? styles.flex : undefined}>
              <DateField
                label="To"
                value={query.to ?? null}
                min={query.from ?? undefined}
                onChange={(day) => filter({ to: day ?? undefined })}
              />
            </View>
          </>
        }
        filters={
          <FilterGroups>
            <FilterGroup label="Show">
              <ToggleChips
                label="Show"
                values={query.kinds ?? []}
                options={kinds.map((k) => ({
                  value: k,
                  label: logbookKindWords[k].chip,
                  icon: (
                    <Feather
                      name={logbookKindIcon[k]}
                      size={14}
                      color={(query.kinds ?? []).includes(k) ? colors.baseText : colors.base}
                    />
                  ),
                }))}
                onChange={(v) => filter({ kinds: v })}
              />
            </FilterGroup>
          </FilterGroups>
        }
      />
      <ExportCard rideId={rideId} rideName={ride?.name ?? 'ride'} filter={current} total={book.data?.total} />
      <PagedList
        query={book}
        noun={(n) => (n === 1 ? 'entry' : 'entries')}
        setPage={(page) => setQuery({ page })}
      >
        {(page) =>
          page.events.length === 0 ? (
            <Card>
              <Text variant="heading">Nothing matches.</Text>
              <Text muted>
                {query.kinds || query.from || query.to || query.q
                  ? 'No entry of this ride matches the filter. Clear a filter to see more.'
                  : 'Nothing has been recorded on this ride yet.'}
              </Text>
            </Card>
          ) : (
            <View style={styles.list} accessibilityLabel="Logbook entries">
              <Text variant="small" muted style={styles.zone}>
                Times on the site’s clock ({page.ride.timeZone}).
              </Text>
              {page.events.map((e) => (
                <LogbookEntry key={e.id} event={e} zone={page.ride.timeZone} wide={wide} />
              ))}
            </View>
          )
        }
      </PagedList>
    </SubScreen>
  );
}

/** The filter's entries, every page of them, as a PDF (A4 or Letter) or a CSV file. */
function ExportCard({
  rideId,
  rideName,
  filter,
  total,
}: {
  rideId: string;
  rideName: string;
  filter: LogbookFilter;
  total: number | undefined;
}) {
  const [csv, setCsv] = useState<{ busy: boolean; message: string | null; ok: boolean }>({
    busy: false,
    message: null,
    ok: true,
  });
  const stem = `logbook-${rideName}`;
  const getCsv = async () => {
    setCsv({ busy: true, message: null, ok: true });
    try {
      const words = await saveOrShareApiFile(
        logbookCsvPath(rideId, filter),
        `${stem.replace(/[^\w.-]+/g, '_')}.csv`,
        fileTypes.csv,
      );
      setCsv({ busy: false, message: words, ok: true });
    } catch (err) {
      const why =
        err instanceof OfflineError
          ? 'No connection: the file is made by the server, so download it when you have signal.'
          : err instanceof Error
            ? err.message
            : 'Try again.';
      setCsv({ busy: false, message: `The CSV file could not be fetched. ${why}`, ok: false });
    }
  };
  return (
    <Card accessibilityLabel="Download the logbook">
      <Text variant="heading">Download</Text>
      <Text variant="small" muted>
        {filterWords(filter)}
        {total !== undefined ? ` — ${total} ${total === 1 ? 'entry' : 'entries'}, all pages` : ''}
      </Text>
      <View style={styles.downloads}>
        <PaperSizeDownload
          label="Logbook PDF"
          what={`the logbook of ${rideName}`}
          progressLabel={`Logbook of ${rideName}`}
          failure="The PDF could not be fetched."
          offline="No connection: the PDF is made by the server, so download it when you have signal."
          fetch={(size, onProgress) =>
            downloadPdf(logbookPdfPath(rideId, filter, size), pdfFileName(stem, size), onProgress)
          }
        />
        <Button
          label="CSV file"
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          busy={csv.busy}
          accessibilityLabel={`CSV file: ${handOverVerb} the logbook of ${rideName} as a CSV file`}
          onPress={() => void getCsv()}
          style={styles.start}
        />
        {csv.message ? (
          <Text
            variant="small"
            role={csv.ok ? 'status' : 'alert'}
            color={csv.ok ? undefined : colors.danger}
            style={styles.message}
          >
            {csv.message}
          </Text>
        ) : null}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0 },
  start: { alignSelf: 'flex-start' },
  downloads: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start', gap: space.sm },
  message: { width: '100%' },
  zone: { paddingHorizontal: space.md, paddingTop: space.sm },
  list: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
});
