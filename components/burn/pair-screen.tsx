import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { statusLabels } from '../../shared/terms/burn';
import type { Lane, MeasurementInput } from '../../shared/schemas/burn';
import { GRAMS_PER_OZ } from '../../shared/units';
import {
  burnKeys,
  useCorrectionMutation,
  useReturnPairMutation,
  useSignOffMutation,
  useSubmitPairMutation,
} from '../api/burn';
import { loadSchemaKit } from '../schemas';
import { bannerMessage } from '../api/error-messages';
import { Loading } from '../lab-gate';
import { useLab } from '../lab-context';
import { colors, space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import {
  formatLength,
  formatMass,
  formatWhen,
  gramsFromText,
  millimetresFromText,
  round,
  useUnitSystem,
} from '../units';
import { BenchCaution } from './bench-caution';
import { formatSeconds } from './clock';
import { pendingMeasurement, queueMeasurement, useOutbox } from './outbox';
import { PhotoStrip } from './photo-strip';
import { usePairWithCache } from './use-pair';

type Fields = {
  charLength: string;
  charWidth: string;
  massBefore: string;
  massAfter: string;
  drips: boolean;
  notes: string;
};

function MeasureForm({
  lane,
  onSave,
  busyLabel,
  testPrefix,
}: {
  lane: Lane;
  onSave: (v: MeasurementInput) => void;
  busyLabel: string;
  testPrefix: string;
}) {
  const units = useUnitSystem();
  const m = lane.measurement;
  const mm = (v: number | null | undefined) =>
    v === null || v === undefined ? '' : units === 'us' ? round(v / 25.4, 2) : round(v, 1);
  const g = (v: number | null | undefined) =>
    v === null || v === undefined ? '' : units === 'us' ? round(v / GRAMS_PER_OZ, 3) : round(v, 2);
  const [f, setF] = useState<Fields>({
    charLength: mm(m?.charLengthMm),
    charWidth: mm(m?.charWidthMm),
    massBefore: g(m?.massBeforeG ?? lane.specimen.dryMassBeforeG),
    massAfter: g(m?.massAfterG),
    drips: m?.flamingDrips ?? false,
    notes: m?.notes ?? '',
  });
  const toMm = (t: string) => millimetresFromText(t, units);
  const toG = (t: string) => gramsFromText(t, units);
  const [problem, setProblem] = useState<string>();
  const set = (key: keyof Fields) => (value: string) => setF((x) => ({ ...x, [key]: value }));
  const len = units === 'us' ? 'in' : 'mm';
  const mass = units === 'us' ? 'oz' : 'g';
  return (
    <View style={{ gap: space.sm }}>
      <TextField
        label={`Char length (${len})`}
        value={f.charLength}
        onChangeText={set('charLength')}
        inputMode="decimal"
        testID={`${testPrefix}-char-length`}
      />
      <TextField
        label={`Char width (${len}, optional)`}
        value={f.charWidth}
        onChangeText={set('charWidth')}
        inputMode="decimal"
      />
      <TextField
        label={`Mass before burning (${mass})`}
        value={f.massBefore}
        onChangeText={set('massBefore')}
        inputMode="decimal"
        testID={`${testPrefix}-mass-before`}
      />
      <TextField
        label={`Mass after burning (${mass})`}
        value={f.massAfter}
        onChangeText={set('massAfter')}
        inputMode="decimal"
        testID={`${testPrefix}-mass-after`}
      />
      <Pressable
        role="checkbox"
        aria-checked={f.drips}
        onPress={() => setF((x) => ({ ...x, drips: !x.drips }))}
        style={styles.check}
      >
        <View style={[styles.box, f.drips && styles.boxOn]} />
        <AppText>Flaming drips fell</AppText>
      </Pressable>
      <TextField label="Notes" value={f.notes} onChangeText={set('notes')} multiline />
      {problem ? <Banner tone="error" message={problem} testID={`${testPrefix}-problem`} /> : null}
      <Button
        label={busyLabel}
        compact
        testID={`${testPrefix}-save`}
        onPress={async () => {
          const values = {
            ...(toMm(f.charLength) !== undefined ? { charLengthMm: toMm(f.charLength)! } : {}),
            ...(toMm(f.charWidth) !== undefined ? { charWidthMm: toMm(f.charWidth)! } : {}),
            ...(toG(f.massBefore) !== undefined ? { massBeforeG: toG(f.massBefore)! } : {}),
            ...(toG(f.massAfter) !== undefined ? { massAfterG: toG(f.massAfter)! } : {}),
            flamingDrips: f.drips,
            ...(f.notes.trim() ? { notes: f.notes.trim() } : {}),
          };
          // Checked here with the server's schema: a queued write the server would refuse is lost work.
          const kit = await loadSchemaKit().catch(() => undefined);
          if (!kit) {
            setProblem('Cannot check the values without a connection yet. Try again in a moment.');
            return;
          }
          const checked = kit.measurementInputSchema.safeParse(values);
          if (!checked.success) {
            setProblem(checked.error.issues.map((i) => i.message).join(' '));
            return;
          }
          setProblem(undefined);
          onSave(checked.data);
        }}
      />
    </View>
  );
}

function LaneCard({
  lane,
  labId,
  pairId,
  editable,
  reviewer,
  signedOff,
}: {
  lane: Lane;
  labId: string;
  pairId: string;
  editable: boolean;
  reviewer: boolean;
  signedOff: boolean;
}) {
  const units = useUnitSystem();
  const client = useQueryClient();
  useOutbox();
  const correction = useCorrectionMutation(labId, pairId);
  const [reason, setReason] = useState('');
  const [correcting, setCorrecting] = useState(false);
  const waiting = pendingMeasurement(pairId, lane.specimen.id);
  const d = lane.derived;
  const m = lane.measurement;
  const prefix = `measure-${lane.role}`;
  return (
    <Card
      title={`${lane.role === 'control' ? 'Control' : 'Treated'} · ${lane.specimen.code}`}
      testID={`result-${lane.role}`}
    >
      <AppText tone="muted">
        {lane.specimen.substrate}
        {lane.specimen.batch
          ? ` · batch ${lane.specimen.batch.code}, ${lane.specimen.batch.recipeName} rev. ${lane.specimen.batch.revisionNumber}`
          : ' · untreated'}
        {lane.specimen.addOnPct !== null ? ` · add-on ${round(lane.specimen.addOnPct, 2)} %` : ''}
      </AppText>
      <AppText testID={`${lane.role}-times`}>
        Afterflame {d.afterflameComplete ? '' : '≥ '}
        {formatSeconds(d.afterflameMs)} · afterglow {formatSeconds(d.afterglowMs)} · exposure{' '}
        {formatSeconds(d.exposureMs)}
        {d.reignitions ? ` · re-ignited ${d.reignitions}×` : ''}
        {d.burnedToClamp ? ' · burned to the clamp' : ''}
        {d.stopped ? ' · stopped before going out' : ''}
      </AppText>
      {m ? (
        <AppText testID={`${lane.role}-measured`}>
          Char length {formatLength(m.charLengthMm, units)}
          {m.charWidthMm !== null ? ` × ${formatLength(m.charWidthMm, units)}` : ''} · mass{' '}
          {m.massBeforeG !== null ? formatMass(m.massBeforeG, units) : '–'} →{' '}
          {m.massAfterG !== null ? formatMass(m.massAfterG, units) : '–'}
          {m.massLossPct !== null ? ` (loss ${round(m.massLossPct, 2)} %)` : ''}
          {m.flamingDrips ? ' · flaming drips' : ''}
        </AppText>
      ) : (
        <AppText tone="muted">Not measured yet.</AppText>
      )}
      {waiting ? (
        <Banner
          tone="caution"
          message="Measurement kept on this device; it is sent as soon as the connection allows."
        />
      ) : null}
      {editable ? (
        <MeasureForm
          lane={lane}
          busyLabel="Save measurement"
          testPrefix={prefix}
          onSave={(v) => queueMeasurement(labId, pairId, lane.specimen.id, v)}
        />
      ) : null}
      {signedOff && reviewer ? (
        correcting ? (
          <View style={{ gap: space.sm }} testID={`correct-${lane.role}`}>
            <Banner
              tone="info"
              message="A correction to a signed-off test keeps the old and new values and your reason in its history."
            />
            <TextField
              label="Reason for the correction"
              value={reason}
              onChangeText={setReason}
              testID={`${prefix}-reason`}
            />
            {correction.error ? (
              <Banner tone="error" message={bannerMessage(correction.error)} />
            ) : null}
            <MeasureForm
              lane={lane}
              busyLabel="Save the correction"
              testPrefix={`${prefix}-fix`}
              onSave={(v) =>
                correction.mutate({ specimenId: lane.specimen.id, changes: v, reason })
              }
            />
          </View>
        ) : (
          <Button
            label="Correct…"
            tone="secondary"
            compact
            onPress={() => setCorrecting(true)}
            testID={`start-correct-${lane.role}`}
          />
        )
      ) : null}
      <PhotoStrip
        labId={labId}
        pairId={pairId}
        lane={lane}
        canEdit={editable}
        onUploaded={() => void client.invalidateQueries({ queryKey: burnKeys.pair(labId, pairId) })}
      />
    </Card>
  );
}

const actionWords: Record<string, string> = {
  pair_submitted: 'Submitted for review',
  pair_signed_off: 'Signed off',
  pair_returned: 'Returned',
  measurement_corrected: 'Corrected',
  pair_imported: 'Imported from a file',
};

export function PairScreen({ pairId }: { pairId: string }) {
  const { lab, can } = useLab();
  const { pair, offlineCopy } = usePairWithCache(lab.id, pairId);
  const submit = useSubmitPairMutation(lab.id, pairId);
  const signOff = useSignOffMutation(lab.id, pairId);
  const giveBack = useReturnPairMutation(lab.id, pairId);
  const [comment, setComment] = useState('');
  if (!pair) return <Loading />;
  const editable = can('edit') && (pair.status === 'draft' || pair.status === 'returned');
  const error = submit.error ?? signOff.error ?? giveBack.error;
  return (
    <View style={{ gap: space.lg }}>
      <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
        Burn test {pair.lanes[1]!.specimen.code}
      </AppText>
      <AppText variant="label" testID="pair-status">
        {statusLabels[pair.status]}
        {pair.signedOffAt ? ` ${formatWhen(pair.signedOffAt)}` : ''}
      </AppText>
      {offlineCopy ? (
        <Banner tone="caution" message="No connection: showing the copy kept on this device." />
      ) : null}
      {pair.status === 'returned' && pair.reviewComment ? (
        <Banner tone="caution" message={`Returned by the reviewer: ${pair.reviewComment}`} />
      ) : null}
      {error ? <Banner tone="error" message={bannerMessage(error)} /> : null}
      <BenchCaution />
      <Link href={`/labs/${lab.id}/burn-tests/pairs/${pair.id}/timer` as never} testID="open-timer">
        <AppText variant="label" style={{ color: colors.primary }}>
          Open the timer
        </AppText>
      </Link>
      {pair.lanes.map((lane) => (
        <LaneCard
          key={lane.specimen.id}
          lane={lane}
          labId={lab.id}
          pairId={pair.id}
          editable={editable}
          reviewer={can('review')}
          signedOff={pair.status === 'signed_off'}
        />
      ))}
      <Card title="Review">
        {editable ? (
          <Button
            label="Submit for review"
            onPress={() => submit.mutate()}
            busy={submit.isPending}
            testID="submit-pair"
          />
        ) : null}
        {pair.status === 'submitted' && can('review') ? (
          <>
            <Button
              label="Sign off"
              onPress={() => signOff.mutate()}
              busy={signOff.isPending}
              testID="sign-off"
            />
            <TextField
              label="What should be fixed (to return it)"
              value={comment}
              onChangeText={setComment}
              testID="return-comment"
            />
            <Button
              label="Return to the technician"
              tone="secondary"
              onPress={() => giveBack.mutate(comment)}
              busy={giveBack.isPending}
              testID="return-pair"
            />
          </>
        ) : null}
        {pair.status === 'submitted' && !can('review') ? (
          <AppText tone="muted">Waiting for a reviewer.</AppText>
        ) : null}
        {pair.status === 'signed_off' ? (
          <AppText tone="muted">
            Signed off: the record is locked. Reviewers can correct it with a reason.
          </AppText>
        ) : null}
      </Card>
      <Card title="History" testID="pair-history">
        {!pair.history.length ? <AppText tone="muted">Nothing yet.</AppText> : null}
        {pair.history.map((h, i) => {
          const detail = h.detail as {
            reason?: string;
            comment?: string;
            before?: Record<string, unknown>;
            after?: Record<string, unknown>;
          };
          return (
            <View key={i} style={{ gap: 2 }} testID="history-entry">
              <AppText variant="label">
                {actionWords[h.action] ?? h.action} · {h.who ?? 'someone'} · {formatWhen(h.at)}
              </AppText>
              {detail.comment ? <AppText>“{detail.comment}”</AppText> : null}
              {detail.reason ? <AppText>Reason: {detail.reason}</AppText> : null}
              {detail.after
                ? Object.keys(detail.after).map((k) => (
                    <AppText key={k} variant="small">
                      {k}: {String(detail.before?.[k] ?? '–')} → {String(detail.after?.[k])}
                    </AppText>
                  ))
                : null}
            </View>
          );
        })}
      </Card>
    </View>
  );
}

const styles = StyleSheet.create({
  check: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 44 },
  box: { width: 26, height: 26, borderWidth: 2, borderColor: colors.ink, borderRadius: 4 },
  boxOn: { backgroundColor: colors.primary, borderColor: colors.primary },
});
