import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';
import { pairImportColumns, pairImportTemplate } from '../../shared/terms/pair-import';
import type {
  PairImportPreview,
  PairImportPreviewRow,
  PairImportResult,
} from '../../shared/schemas/pair-import';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import {
  useAcceptImportMutation,
  useDiscardImportMutation,
  usePreviewImportMutation,
} from '../api/imports';
import { useLab } from '../lab-context';
import { colors, fonts, space, WIDE_BREAKPOINT } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { TextField } from '../ui/text-field';
import { tableStyles } from '../ui/table';
import { AppText } from '../ui/text';
import { canPickFiles, CsvFileInput, saveTextFile } from './csv-file';

// Every row with errors is listed; of the valid ones, enough to see that they were read right.
const VALID_ROWS_SHOWN = 100;

function errorText(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.code === 'payload_too_large') return 'The file is larger than 2 MB: split it.';
    if (error.code === 'invalid_request' && error.fields.length) {
      return `${error.message} ${error.fields.map((f) => f.message).join('. ')}.`;
    }
  }
  return bannerMessage(error);
}

// A unit only after a number read as one: a bad cell is shown as it was written.
function show(value: string | number | boolean | null | undefined, unit = ''): string {
  if (value === null || value === undefined || value === '') return '–';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  return typeof value === 'number' ? `${value}${unit}` : value;
}

function summary(row: PairImportPreviewRow) {
  const v = row.values;
  const held =
    typeof v.held_at === 'string' && /^\d{4}-\d{2}-\d{2}/.test(v.held_at)
      ? v.held_at.slice(0, 10)
      : show(v.held_at);
  return {
    held,
    treatment: `${show(v.recipe)} rev. ${show(v.revision)} · ${show(v.substrate)}`,
    control: show(v.control_char_mm, ' mm'),
    treated: show(v.treated_char_mm, ' mm'),
    afterflame: show(v.treated_afterflame_s, ' s'),
    batch: row.ok && v.batch_new ? `${show(v.batch)} (new)` : show(v.batch),
  };
}

function RowErrors({ row }: { row: PairImportPreviewRow }) {
  if (row.ok) return <AppText tone="ok">Ready</AppText>;
  return (
    <View testID={`row-errors-${row.line}`}>
      {row.errors.map((e, i) => (
        <AppText key={i} tone="danger" variant="small">
          {e.field === 'line' ? e.message : `${e.field}: ${e.message}`}
        </AppText>
      ))}
    </View>
  );
}

const HEAD = ['Line', 'Held', 'Treatment', 'Control char', 'Treated char', 'Afterflame', 'Batch'];

function PreviewTable({ rows }: { rows: PairImportPreviewRow[] }) {
  return (
    <View role="table" aria-label="Rows of the file" style={styles.table}>
      <View role="row" style={[tableStyles.row, tableStyles.head]}>
        {[...HEAD, 'Check'].map((h, i) => (
          <AppText
            key={h}
            variant="label"
            role="columnheader"
            style={[tableStyles.cell, (i === 2 || i === 7) && styles.wide]}
          >
            {h}
          </AppText>
        ))}
      </View>
      {rows.map((row) => {
        const s = summary(row);
        return (
          <View key={row.line} role="row" style={tableStyles.row} testID={`import-row-${row.line}`}>
            {[row.line, s.held, s.treatment, s.control, s.treated, s.afterflame, s.batch].map(
              (text, i) => (
                <AppText key={i} role="cell" style={[tableStyles.cell, i === 2 && styles.wide]}>
                  {text}
                </AppText>
              ),
            )}
            <View role="cell" style={[tableStyles.cell, styles.wide]}>
              <RowErrors row={row} />
            </View>
          </View>
        );
      })}
    </View>
  );
}

function PreviewCards({ rows }: { rows: PairImportPreviewRow[] }) {
  return (
    <View style={{ gap: space.sm }}>
      {rows.map((row) => {
        const s = summary(row);
        return (
          <Card key={row.line} testID={`import-row-${row.line}`} gap="xs">
            <AppText variant="label">
              Line {row.line} · {s.held}
            </AppText>
            <AppText>{s.treatment}</AppText>
            <AppText variant="small" tone="muted">
              Char: control {s.control}, treated {s.treated} · afterflame {s.afterflame} · batch{' '}
              {s.batch}
            </AppText>
            <RowErrors row={row} />
          </Card>
        );
      })}
    </View>
  );
}

/** Each column by name, with what goes in it. */
function ColumnList({ columns }: { columns: readonly (typeof pairImportColumns)[number][] }) {
  return columns.map((c) => (
    <AppText key={c.name} variant="small">
      <AppText variant="small" style={styles.code}>
        {c.name}
      </AppText>{' '}
      — {c.about}
    </AppText>
  ));
}

function Format() {
  const required = pairImportColumns.filter((c) => c.required);
  const optional = pairImportColumns.filter((c) => !c.required);
  return (
    <Card title="The file" testID="import-format">
      <AppText>
        A CSV file with a header row, the columns of this lab&apos;s own pairs download (so a file
        downloaded from another lab imports here). Lengths in mm, times in s; a decimal comma works
        as well as a point. Separate cells with commas, or semicolons when numbers use commas.
      </AppText>
      <AppText variant="label">Needed in every row</AppText>
      <ColumnList columns={required} />
      <AppText variant="label">May be left out or empty</AppText>
      <ColumnList columns={optional} />
      {canPickFiles ? (
        <Button
          label="Download the template (CSV)"
          tone="secondary"
          compact
          onPress={() => saveTextFile('pairs-template.csv', pairImportTemplate())}
          testID="import-template"
        />
      ) : (
        <AppText variant="small" selectable style={styles.code}>
          {pairImportTemplate()}
        </AppText>
      )}
    </Card>
  );
}

function Done({
  result,
  labId,
  onAgain,
}: {
  result: PairImportResult;
  labId: string;
  onAgain: () => void;
}) {
  return (
    <Card title="Imported" testID="import-done">
      <Banner
        tone="success"
        message={`Imported ${result.importedPairs} burn test${result.importedPairs === 1 ? '' : 's'} from ${result.fileName} into ${result.sessions.length} session${result.sessions.length === 1 ? '' : 's'}. They wait for review.`}
      />
      {result.sessions.map((s, i) => (
        <Link
          key={s.id}
          href={`/labs/${labId}/burn-tests/sessions/${s.id}` as never}
          testID={`imported-session-${i}`}
        >
          <AppText variant="label" style={{ color: colors.primary }}>
            Session of {s.heldAt.slice(0, 10)} ({s.pairs} pair{s.pairs === 1 ? '' : 's'})
          </AppText>
        </Link>
      ))}
      <Link href={`/labs/${labId}/burn-tests/review` as never} testID="open-review-queue">
        <AppText variant="label" style={{ color: colors.primary }}>
          Open the review queue
        </AppText>
      </Link>
      <Button label="Import another file" tone="secondary" compact onPress={onAgain} />
    </Card>
  );
}

export function ImportScreen() {
  const { lab, can } = useLab();
  const wide = useWindowDimensions().width >= WIDE_BREAKPOINT;
  const check = usePreviewImportMutation(lab.id);
  const accept = useAcceptImportMutation(lab.id);
  const discard = useDiscardImportMutation(lab.id);
  const [pasted, setPasted] = useState('');
  const [preview, setPreview] = useState<PairImportPreview>();
  const [result, setResult] = useState<PairImportResult>();
  const [error, setError] = useState<string>();

  const reset = () => {
    setPreview(undefined);
    setResult(undefined);
    setError(undefined);
    setPasted('');
  };
  const run = async (fileName: string, text: string) => {
    setError(undefined);
    setPreview(undefined);
    try {
      setPreview(await check.mutateAsync({ fileName, text }));
    } catch (err) {
      setError(errorText(err));
    }
  };
  const take = async () => {
    if (!preview) return;
    setError(undefined);
    try {
      setResult(await accept.mutateAsync(preview.importId));
      setPreview(undefined);
    } catch (err) {
      setError(errorText(err));
    }
  };
  const drop = async () => {
    if (!preview) return;
    try {
      await discard.mutateAsync(preview.importId);
      reset();
    } catch (err) {
      setError(errorText(err));
    }
  };

  const title = (
    <AppText variant="title" accessibilityRole="header" aria-level={1} testID="section-title">
      Import past results
    </AppText>
  );
  if (!can('edit')) {
    return (
      <View style={{ gap: space.lg }}>
        {title}
        <Banner tone="info" message="Only managers and technicians can import burn tests." />
      </View>
    );
  }
  const rows = preview
    ? [
        ...preview.rows.filter((r) => !r.ok),
        ...preview.rows.filter((r) => r.ok).slice(0, VALID_ROWS_SHOWN),
      ].sort((a, b) => a.line - b.line)
    : [];
  const hidden = preview ? preview.rows.length - rows.length : 0;
  return (
    <View style={{ gap: space.lg }}>
      {title}
      <AppText>
        Paired burn tests done before this lab used Quenchbook, or in another lab, from a CSV file.
        You see every row checked first; nothing is imported until you accept the valid rows.
      </AppText>
      <Banner
        tone="info"
        testID="import-review-rule"
        message="Imported tests wait for review like tests timed here: a reviewer signs each one off before it counts in the ranking. Each import becomes a session named after the file and you; the timer marks are made from the file's times. Masses are not in the file, so add-on and mass loss are kept as percentages of a nominal 100 g specimen."
      />
      {error ? <Banner tone="error" message={error} testID="import-error" /> : null}
      {result ? <Done result={result} labId={lab.id} onAgain={reset} /> : null}
      {!result && !preview ? (
        <>
          <Format />
          <Card title="Your file">
            <CsvFileInput onFile={(f) => void run(f.name, f.text)} disabled={check.isPending} />
            <TextField
              label={canPickFiles ? 'Or paste the CSV' : 'Paste the CSV'}
              value={pasted}
              onChangeText={setPasted}
              multiline
              numberOfLines={6}
              style={styles.paste}
              autoCapitalize="none"
              autoCorrect={false}
              testID="import-paste"
            />
            <Button
              label="Check the pasted text"
              onPress={() => void run('pasted.csv', pasted)}
              disabled={!pasted.trim()}
              busy={check.isPending}
              testID="import-check"
            />
          </Card>
        </>
      ) : null}
      {preview ? (
        <Card title={`Checked: ${preview.fileName}`} testID="import-preview">
          <AppText variant="label" testID="import-counts">
            {preview.validCount} row{preview.validCount === 1 ? '' : 's'} can be imported ·{' '}
            {preview.errorCount} with errors
          </AppText>
          {preview.errorCount ? (
            <AppText tone="muted">
              Rows with errors are left out. To import them too, correct the file and check it
              again.
            </AppText>
          ) : null}
          {preview.ignoredColumns.length ? (
            <AppText tone="muted">Columns not used: {preview.ignoredColumns.join(', ')}.</AppText>
          ) : null}
          {wide ? <PreviewTable rows={rows} /> : <PreviewCards rows={rows} />}
          {hidden ? <AppText tone="muted">And {hidden} more valid rows.</AppText> : null}
          <View style={styles.actions}>
            <Button
              label={`Import ${preview.validCount} valid row${preview.validCount === 1 ? '' : 's'}`}
              onPress={() => void take()}
              disabled={!preview.validCount}
              busy={accept.isPending}
              testID="accept-import"
            />
            <Button
              label="Discard"
              tone="secondary"
              onPress={() => void drop()}
              busy={discard.isPending}
              testID="discard-import"
            />
          </View>
        </Card>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  table: { borderTopWidth: 1, borderTopColor: colors.line },
  wide: { flex: 2 },
  code: { fontFamily: fonts.semibold },
  paste: { minHeight: 120, paddingVertical: space.sm, textAlignVertical: 'top' },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
