import { Link } from 'expo-router';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Platform, Pressable, StyleSheet, useWindowDimensions, View } from 'react-native';
import { deriveLane, nextMarks, type LaneState } from '../../shared/burn/derive';
import { markLabels, type Mark, type MarkKind } from '../../shared/terms/marks';
import type { Lane } from '../../shared/schemas/burn';
import { newClientId } from '../client-id';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, fonts, radius, space, WIDE_BREAKPOINT } from '../theme';
import { Banner } from '../ui/banner';
import { AppText } from '../ui/text';
import { beep } from './beep';
import { formatSeconds, nowMs } from './clock';
import { pendingMarks, queueMarks, useOutbox, type OutboxMark } from './outbox';
import { usePairWithCache } from './use-pair';

const stateWords: Record<LaneState, string> = {
  ready: 'Ready',
  exposing: 'Flame on',
  afterflame: 'Flaming',
  afterglow: 'Glowing',
  done: 'Finished',
};
const stateColours: Record<LaneState, string> = {
  ready: colors.surface,
  exposing: '#FFE8B3',
  afterflame: '#FFD1C2',
  afterglow: '#FFF1E0',
  done: '#E7F4EC',
};

// Keys for the wide screen: control lane on the left hand, treated on the right.
const keys: Record<'control' | 'treated', Partial<Record<MarkKind | 'undo', string>>> = {
  control: {
    flame_applied: 'a',
    flame_removed: 's',
    flame_out: 'd',
    glow_out: 'f',
    reignited: 'r',
    undo: 'z',
  },
  treated: {
    flame_applied: 'j',
    flame_removed: 'k',
    flame_out: 'l',
    glow_out: ';',
    reignited: 'u',
    undo: 'm',
  },
};

function lastAt(marks: Mark[], kinds: MarkKind[]): number | undefined {
  return [...marks].reverse().find((m) => kinds.includes(m.kind))?.atMs;
}

function LaneView({
  lane,
  marks,
  exposureS,
  now,
  locked,
  wide,
  onMark,
}: {
  lane: Lane;
  marks: Mark[];
  exposureS: number;
  now: number;
  locked: boolean;
  wide: boolean;
  onMark: (kind: MarkKind, undoes?: string) => void;
}) {
  const derived = useMemo(() => deriveLane(marks), [marks]);
  const role = lane.role;
  const applied = lastAt(derived.effective, ['flame_applied']);
  const removed = lastAt(derived.effective, ['flame_removed']);
  const out = lastAt(derived.effective, ['flame_out', 'reignited']);
  let big = '–';
  let caption = '';
  if (derived.state === 'exposing' && applied !== undefined) {
    const left = exposureS * 1000 - (now - applied);
    big = left > 0 ? formatSeconds(left) : `+${formatSeconds(-left)}`;
    caption = left > 0 ? 'Exposure left' : 'Exposure over: remove the flame';
  } else if (derived.state === 'afterflame' && removed !== undefined) {
    big = formatSeconds(now - (out ?? removed));
    caption = 'Flaming for';
  } else if (derived.state === 'afterglow' && out !== undefined) {
    big = formatSeconds(now - out);
    caption = 'Glowing for';
  } else if (derived.state === 'done') {
    big = formatSeconds(derived.afterflameMs);
    caption = 'Afterflame';
  }
  const overdue =
    derived.state === 'exposing' && applied !== undefined && now - applied >= exposureS * 1000;
  const last = derived.effective[derived.effective.length - 1];
  const main = nextMarks(derived.state);
  const title = `${role === 'control' ? 'Control (untreated)' : 'Treated'} · ${lane.specimen.code}`;
  return (
    // A named group per lane, so a screen reader tells the two "Flame applied" buttons apart.
    <View
      role="group"
      aria-label={title}
      style={[styles.lane, { backgroundColor: overdue ? '#FFB38A' : stateColours[derived.state] }]}
      testID={`lane-${role}`}
    >
      <AppText variant="label" tone="muted">
        {title}
      </AppText>
      <AppText variant="heading" testID={`lane-${role}-state`}>
        {stateWords[derived.state]}
      </AppText>
      <AppText style={styles.big} testID={`lane-${role}-clock`}>
        {big}
      </AppText>
      <AppText variant="small" tone="muted">
        {caption}
      </AppText>
      <View style={styles.buttons}>
        {main.map((kind, index) => (
          <Pressable
            key={kind}
            accessibilityRole="button"
            disabled={locked}
            testID={`mark-${role}-${kind}`}
            onPress={() => onMark(kind)}
            style={[
              styles.markButton,
              index === 0 ? styles.primaryMark : styles.secondaryMark,
              locked && styles.off,
            ]}
          >
            <AppText
              variant="label"
              style={{
                color: index === 0 ? colors.onPrimary : colors.ink,
                fontSize: index === 0 ? 22 : 16,
              }}
            >
              {markLabels[kind]}
              {wide && keys[role][kind] ? `  [${keys[role][kind]}]` : ''}
            </AppText>
          </Pressable>
        ))}
      </View>
      {last && !locked ? (
        <Pressable
          accessibilityRole="button"
          testID={`undo-${role}`}
          onPress={() => onMark('undo', last.id)}
          style={styles.undo}
        >
          <AppText variant="label" style={{ color: colors.primary }}>
            Undo “{markLabels[last.kind]}”{wide ? `  [${keys[role].undo}]` : ''}
          </AppText>
        </Pressable>
      ) : null}
      <AppText variant="small" testID={`lane-${role}-times`}>
        Exposure {formatSeconds(derived.exposureMs)} · afterflame{' '}
        {derived.afterflameComplete ? '' : '≥ '}
        {formatSeconds(derived.afterflameMs)} · afterglow {formatSeconds(derived.afterglowMs)}
        {derived.reignitions ? ` · re-ignited ${derived.reignitions}×` : ''}
        {derived.flamingDrips ? ` · drips ${derived.flamingDrips}` : ''}
      </AppText>
      {derived.problems.map((p) => (
        <AppText key={p} variant="small" tone="danger">
          {p}
        </AppText>
      ))}
    </View>
  );
}

/** Two lanes, one per specimen, big targets, times from one monotonic clock; works offline. */
export function TimerScreen({ pairId }: { pairId: string }) {
  const { lab, can } = useLab();
  const wide = useWindowDimensions().width >= WIDE_BREAKPOINT;
  const { pair, offlineCopy, error } = usePairWithCache(lab.id, pairId);
  const outbox = useOutbox();
  const [now, setNow] = useState(nowMs);
  const cued = useRef(new Set<string>());

  useEffect(() => {
    const timer = setInterval(() => setNow(nowMs()), 100);
    return () => clearInterval(timer);
  }, []);

  const lanes = useMemo(() => {
    if (!pair) return [];
    const waiting = pendingMarks(pair.id);
    return pair.lanes.map((lane) => {
      const ids = new Set(lane.marks.map((m) => m.id));
      const mine: Mark[] = [
        ...lane.marks.map((m) => ({
          id: m.id,
          kind: m.kind as MarkKind,
          atMs: m.atMs,
          ...(m.undoes ? { undoes: m.undoes } : {}),
        })),
        ...waiting
          .filter((m) => m.specimenId === lane.specimen.id && !ids.has(m.id))
          .map((m) => ({
            id: m.id,
            kind: m.kind,
            atMs: m.atMs,
            ...(m.undoes ? { undoes: m.undoes } : {}),
          })),
      ];
      return { lane, marks: mine };
    });
    // outbox.ops: recompute when marks are queued or sent.
  }, [pair, outbox.ops]);

  // The end of the exposure: a tone and a colour change, once per flame application.
  useEffect(() => {
    if (!pair) return;
    for (const { marks } of lanes) {
      const d = deriveLane(marks);
      const applied = [...d.effective].reverse().find((m) => m.kind === 'flame_applied');
      if (
        d.state === 'exposing' &&
        applied &&
        now - applied.atMs >= pair.exposureS * 1000 &&
        !cued.current.has(applied.id)
      ) {
        cued.current.add(applied.id);
        beep();
      }
    }
  }, [now, lanes, pair]);

  const locked = !pair || !(pair.status === 'draft' || pair.status === 'returned') || !can('edit');
  const mark = (specimenId: string, kind: MarkKind, undoes?: string) => {
    if (!pair || locked) return;
    const m: OutboxMark = {
      id: newClientId(),
      specimenId,
      kind,
      atMs: nowMs(),
      ...(undoes ? { undoes } : {}),
    };
    queueMarks(lab.id, pair.id, [m]);
  };

  useEffect(() => {
    if (Platform.OS !== 'web' || !wide || !pair) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.target instanceof HTMLInputElement || e.target instanceof HTMLTextAreaElement) return;
      for (const { lane, marks } of lanes) {
        const d = deriveLane(marks);
        const allowed = nextMarks(d.state);
        for (const [kind, key] of Object.entries(keys[lane.role])) {
          if (e.key !== key) continue;
          if (kind === 'undo') {
            const last = d.effective[d.effective.length - 1];
            if (last) mark(lane.specimen.id, 'undo', last.id);
          } else if (allowed.includes(kind as MarkKind)) {
            mark(lane.specimen.id, kind as MarkKind);
          }
        }
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  });

  if (!pair)
    return error ? (
      <Banner
        tone="error"
        message="This test could not be loaded, and no copy is kept on this device."
      />
    ) : (
      <Loading />
    );
  const waiting = pendingMarks(pair.id).length;
  return (
    <View style={styles.screen}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Timer
      </AppText>
      <AppText tone="muted">
        {pair.lanes[0]!.specimen.code} beside {pair.lanes[1]!.specimen.code} · flame for{' '}
        {pair.exposureS} s
      </AppText>
      <View testID="sync-status">
        {waiting ? (
          <Banner
            tone="caution"
            message={`${waiting} mark${waiting === 1 ? '' : 's'} kept on this device, not yet saved: ${outbox.syncing ? 'sending…' : 'they go as soon as the connection returns.'}`}
            testID="sync-pending"
          />
        ) : (
          <Banner
            tone="success"
            message={
              offlineCopy
                ? 'Working from the copy on this device (no connection).'
                : 'Every mark is saved.'
            }
            testID="sync-ok"
          />
        )}
        {outbox.failures.map((f) => (
          <Banner key={f.at} tone="error" message={`Not saved: ${f.message}`} />
        ))}
      </View>
      {!pair.checklistComplete ? (
        <Banner
          tone="error"
          message="The safety checklist of this session is not complete: tick it before the first flame."
        />
      ) : null}
      {locked && pair.checklistComplete ? (
        <Banner
          tone="info"
          message={
            can('edit')
              ? 'This test is submitted or signed off: the timer is read-only.'
              : 'Only technicians and managers run the timer.'
          }
        />
      ) : null}
      <View style={[styles.lanes, wide && styles.lanesWide]}>
        {lanes.map(({ lane, marks }) => (
          <LaneView
            key={lane.specimen.id}
            lane={lane}
            marks={marks}
            exposureS={pair.exposureS}
            now={now}
            locked={locked || !pair.checklistComplete}
            wide={wide}
            onMark={(kind, undoes) => mark(lane.specimen.id, kind, undoes)}
          />
        ))}
      </View>
      <Link href={`/labs/${lab.id}/burn-tests/pairs/${pair.id}` as never} testID="timer-done">
        <AppText variant="label" style={{ color: colors.primary }}>
          Measurements, photos and review →
        </AppText>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  screen: { gap: space.md },
  lanes: { gap: space.md },
  lanesWide: { flexDirection: 'row' },
  lane: {
    flex: 1,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.line,
    padding: space.lg,
    gap: space.sm,
  },
  big: { fontFamily: fonts.bold, fontSize: 56, lineHeight: 64, fontVariant: ['tabular-nums'] },
  buttons: { gap: space.sm },
  markButton: {
    minHeight: 64,
    borderRadius: radius.md,
    alignItems: 'center',
    justifyContent: 'center',
    paddingHorizontal: space.md,
  },
  primaryMark: { backgroundColor: colors.primary, minHeight: 88 },
  secondaryMark: { backgroundColor: colors.surface, borderWidth: 2, borderColor: colors.line },
  off: { opacity: 0.5 },
  undo: { minHeight: 44, justifyContent: 'center' },
});
