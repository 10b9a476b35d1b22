import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { LabelledLine } from '@/components/labelled-line';
import { QueryState } from '@/components/query-state';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { roleHome } from '@/features/auth';
import { RoleGate } from '@/features/auth/ui';
import { NO_LOCAL_MAILBOX, useOutboxMessageQuery, useOutboxQuery } from '@/features/notices/outbox-api';
import { downloadOutboxAttachment } from '@/features/notices/outbox-download';
import { attachmentFileName, formatBytes, htmlToText } from '@/features/notices/outbox-text';
import type { OutboxMessage, outboxMessageResponseSchema } from '@/features/notices/schema';
import { formatDateTime } from '@/lib/dates';

type FullMessage = z.infer<typeof outboxMessageResponseSchema>['message'];
type Attachment = OutboxMessage['attachments'][number];

const back = { href: roleHome.admin, label: 'Administration' };

/**
 * `/admin/outbox`: every e-mail the server's built-in mailbox received (development, the demo and tests),
 * newest first, and one message at a time with its text and attachments. With a real SMTP server there
 * is no local mailbox, and the screen says so.
 */
export function OutboxScreen() {
  return <RoleGate roles={['admin']}>{() => <Outbox />}</RoleGate>;
}

function Outbox() {
  const list = useOutboxQuery();
  const wide = useWide();
  const [selected, setSelected] = useState<string | null>(null);
  const noMailbox = list.error instanceof ApiRequestError && list.error.code === NO_LOCAL_MAILBOX;
  const count = list.data?.messages.length;

  return (
    <SubScreen
      title="Outbox"
      subtitle={
        count === undefined
          ? 'Every e-mail the server has sent, as its built-in mailbox received it.'
          : `${count} ${count === 1 ? 'e-mail' : 'e-mails'} received by the built-in mailbox, newest first.`
      }
      back={back}
      wideContent
      actions={
        noMailbox ? null : (
          <Button
            label="Refresh"
            tone="quiet"
            busy={list.isFetching && !list.isPending}
            onPress={() => void list.refetch()}
          />
        )
      }
    >
      {noMailbox ? (
        <NoMailbox message={list.error instanceof ApiRequestError ? list.error.message : ''} />
      ) : (
        <QueryState query={list}>
          {({ messages }) =>
            messages.length === 0 ? (
              <Card>
                <Text variant="heading">No e-mail yet</Text>
                <Text muted>
                  Notices are e-mailed when a supervisor approves an inspection with findings or changes a
                  ride’s status. Each one the server sends shows up here.
                </Text>
              </Card>
            ) : wide ? (
              <View style={styles.panes}>
                <View style={styles.listPane}>
                  <MessageList messages={messages} selected={selected} onSelect={setSelected} />
                </View>
                <View style={styles.viewPane}>
                  {selected ? (
                    <MessageView key={selected} id={selected} />
                  ) : (
                    <Card>
                      <Text muted>Choose a message to read it and download its attachments.</Text>
                    </Card>
                  )}
                </View>
              </View>
            ) : selected ? (
              <View style={styles.stack}>
                <Button label="All messages" tone="quiet" onPress={() => setSelected(null)} />
                <MessageView key={selected} id={selected} />
              </View>
            ) : (
              <MessageList messages={messages} selected={null} onSelect={setSelected} />
            )
          }
        </QueryState>
      )}
    </SubScreen>
  );
}

function NoMailbox({ message }: { message: string }) {
  return (
    <Card role="alert" accessibilityLabel="No local mailbox">
      <Text variant="heading">No local mailbox</Text>
      {message ? <Text>{message}</Text> : null}
      <Text muted>
        The outbox only shows mail while the server keeps it itself: in development, the demo and tests, when
        SMTP_URL is not set. Each notice’s delivery state is still shown on the notice.
      </Text>
    </Card>
  );
}

// ——— the list ———

function MessageList({
  messages,
  selected,
  onSelect,
}: {
  messages: OutboxMessage[];
  selected: string | null;
  onSelect: (id: string) => void;
}) {
  return (
    <View role="list" accessibilityLabel="Messages" style={styles.list}>
      {messages.map((m) => {
        const current = m.id === selected;
        return (
          // The subject is the button (named by its words, WCAG 2.5.3); a click elsewhere on the row
          // chooses the message too, for a mouse.
          <View key={m.id} role="listitem">
            <Pressable
              focusable={false}
              accessible={false}
              onPress={() => onSelect(m.id)}
              style={StyleSheet.flatten([styles.row, current && styles.rowCurrent])}
            >
              <View style={styles.rowHead}>
                <Text variant="figure" muted style={styles.small}>
                  {formatDateTime(m.receivedAt)}
                </Text>
                <Text variant="small" muted>
                  {formatBytes(m.size)}
                </Text>
              </View>
              <Pressable
                role="button"
                accessibilityLabel={`Message: ${m.subject || '(no subject)'}`}
                accessibilityState={{ selected: current }}
                onPress={() => onSelect(m.id)}
              >
                <Text variant="heading" numberOfLines={2}>
                  {m.subject || '(no subject)'}
                </Text>
              </Pressable>
              <LabelledLine label="From" value={m.from} numberOfLines={2} />
              <LabelledLine label="To" value={m.to.join(', ') || '—'} numberOfLines={2} />
              {m.attachments.map((a) => (
                <View key={a.index} style={styles.attachLine}>
                  <Feather name="paperclip" size={14} color={colors.textMuted} />
                  <Text variant="small" style={styles.shrink}>
                    {attachmentFileName(a)} ({formatBytes(a.size)})
                  </Text>
                </View>
              ))}
            </Pressable>
          </View>
        );
      })}
    </View>
  );
}

// ——— one message ———

function MessageView({ id }: { id: string }) {
  const query = useOutboxMessageQuery(id);
  if (query.error instanceof ApiRequestError && query.error.status === 404) {
    return (
      <Card role="alert">
        <Text variant="heading">This message is no longer in the outbox.</Text>
        <Text muted>{query.error.message}</Text>
      </Card>
    );
  }
  return <QueryState query={query}>{({ message }) => <MessageBody message={message} />}</QueryState>;
}

function MessageBody({ message: m }: { message: FullMessage }) {
  const [htmlAsText, setHtmlAsText] = useState(false);
  const showHtml = m.text === null || htmlAsText;
  return (
    <Card accessibilityLabel="Message">
      <Text variant="title" role="heading" aria-level={2}>
        {m.subject || '(no subject)'}
      </Text>
      <View style={styles.facts}>
        <Fact label="From" value={m.from} />
        <Fact label="To" value={m.to.join(', ') || '—'} />
        <Fact label="Received" value={formatDateTime(m.receivedAt)} />
        <Fact label="Size" value={formatBytes(m.size)} />
        {m.messageId ? <Fact label="Message ID" value={m.messageId} mono /> : null}
        {m.idempotencyKey ? <Fact label="Idempotency key" value={m.idempotencyKey} mono /> : null}
      </View>

      <Text variant="label" muted role="heading" aria-level={3} style={styles.sectionGap}>
        {`ATTACHMENTS (${m.attachments.length})`}
      </Text>
      {m.attachments.length === 0 ? (
        <Text muted>None.</Text>
      ) : (
        <View role="list" accessibilityLabel="Attachments" style={styles.attachments}>
          {m.attachments.map((a) => (
            <AttachmentRow key={a.index} messageId={m.id} attachment={a} />
          ))}
        </View>
      )}

      <Text variant="label" muted role="heading" aria-level={3} style={styles.sectionGap}>
        {showHtml && m.html !== null ? 'HTML VERSION, AS PLAIN TEXT' : 'TEXT'}
      </Text>
      {showHtml && m.html !== null ? (
        <Text variant="small" muted>
          Shown as plain text: the HTML is never displayed as a web page here.
        </Text>
      ) : null}
      <View style={styles.body}>
        <Text selectable style={styles.bodyText} accessibilityLabel="Message text">
          {showHtml ? (m.html !== null ? htmlToText(m.html) : 'This message has no text.') : (m.text ?? '')}
        </Text>
      </View>
      {m.text !== null && m.html !== null ? (
        <Button
          label={htmlAsText ? 'Show the text version' : 'Show the HTML version as plain text'}
          tone="quiet"
          onPress={() => setHtmlAsText((v) => !v)}
          style={styles.start}
        />
      ) : null}
    </Card>
  );
}

function Fact({ label, value, mono }: { label: string; value: string; mono?: boolean }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text variant={mono ? 'figure' : 'body'} selectable style={mono ? styles.small : undefined}>
        {value}
      </Text>
    </View>
  );
}

function downloadProblem(err: unknown): string {
  if (err instanceof OfflineError) return 'No connection to the server; nothing was downloaded.';
  if (err instanceof ApiRequestError) return err.message;
  return 'The download failed.';
}

function AttachmentRow({ messageId, attachment: a }: { messageId: string; attachment: Attachment }) {
  const [state, setState] = useState<{ busy: boolean; said: string | null; failed: boolean }>({
    busy: false,
    said: null,
    failed: false,
  });
  const name = attachmentFileName(a);
  const download = async () => {
    setState({ busy: true, said: null, failed: false });
    try {
      const said = await downloadOutboxAttachment(messageId, a.index, name);
      setState({ busy: false, said, failed: false });
    } catch (err) {
      setState({ busy: false, said: downloadProblem(err), failed: true });
    }
  };
  return (
    <View role="listitem" accessibilityLabel={`Attachment: ${name}`} style={styles.attachment}>
      <View style={styles.attachmentText}>
        <View style={styles.attachLine}>
          <Feather name="paperclip" size={16} color={colors.text} />
          <Text variant="heading" style={styles.shrink}>
            {name}
          </Text>
        </View>
        <Text variant="small" muted>
          {a.contentType} · {formatBytes(a.size)}
        </Text>
        {state.said ? (
          <Text
            variant="small"
            color={state.failed ? colors.danger : colors.within}
            accessibilityLiveRegion="polite"
            role={state.failed ? 'alert' : undefined}
          >
            {state.said}
          </Text>
        ) : null}
      </View>
      <Button
        label="Download"
        tone="quiet"
        accessibilityLabel={`Download ${name}`}
        busy={state.busy}
        icon={state.busy ? undefined : <Feather name="download" size={16} color={colors.text} />}
        onPress={() => void download()}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  panes: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  listPane: { width: 460, flexShrink: 0 },
  viewPane: { flex: 1, minWidth: 0 },
  stack: { gap: space.md },
  list: { gap: space.sm },
  row: {
    gap: 2,
    padding: space.md,
    minHeight: layout.touchTarget,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    borderLeftWidth: 4,
    backgroundColor: colors.surface,
  },
  rowCurrent: {
    borderColor: colors.base,
    borderLeftColor: colors.accent,
    backgroundColor: colors.accentSoft,
  },
  rowHead: { flexDirection: 'row', justifyContent: 'space-between', gap: space.sm },
  small: { fontSize: 13, lineHeight: 18 },
  attachLine: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  shrink: { flexShrink: 1 },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.sm },
  fact: { gap: 2, minWidth: 180, flexShrink: 1 },
  sectionGap: { marginTop: space.md },
  attachments: { gap: space.sm },
  attachment: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    backgroundColor: colors.surfaceSunk,
  },
  attachmentText: { gap: 2, flexShrink: 1, minWidth: 160 },
  body: {
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.bg,
  },
  bodyText: { fontSize: 15, lineHeight: 22 },
  start: { alignSelf: 'flex-start' },
});
