import { useState } from 'react';
import { View } from 'react-native';
import { type UnitSystem } from '../../shared/terms/roles';
import { MM_PER_IN } from '../../shared/units';
import { space } from '../theme';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { formatLength, millimetresFromText, round } from '../units';
import { sampleSize } from './sample-size';

/**
 * How many pairs a paired t-test needs to show a given reduction, from the spread of the
 * differences seen so far. Until the field is edited it uses the observed mean difference.
 */
export function SampleSizeHelper({
  sdDiff,
  observedMm,
  have,
  units,
}: {
  sdDiff: number | null;
  observedMm: number | null;
  have: number;
  units: UnitSystem;
}) {
  const [text, setText] = useState<string | null>(null);
  const observed = observedMm === null ? null : Math.abs(observedMm);
  const shown =
    observed === null ? '' : round(units === 'metric' ? observed : observed / MM_PER_IN, 2);
  const reductionMm = text === null ? (observed ?? undefined) : millimetresFromText(text, units);
  const result = sampleSize(reductionMm, sdDiff, have);
  const noSpread = sdDiff === null || !(sdDiff > 0);
  return (
    <View style={{ gap: space.sm }}>
      <TextField
        label={`Reduction to detect (${units === 'metric' ? 'mm' : 'in'})`}
        value={text ?? shown}
        onChangeText={setText}
        inputMode="decimal"
        error={!result.ok && !noSpread ? result.message : undefined}
        testID="reduction-to-detect"
      />
      {result.ok ? (
        <>
          <AppText variant="heading" testID="pairs-needed">
            {result.needed} pairs needed at 80 % power, α = 0.05
          </AppText>
          <AppText testID="pairs-needed-explained">
            With the spread seen so far (SD of the paired differences {formatLength(sdDiff, units)}
            ), {result.needed} pairs give an 80 % chance that a two-sided paired t-test at α = 0.05
            shows a reduction of {formatLength(reductionMm ?? null, units)}, if the true reduction
            is that large. You have {have}:{' '}
            {result.more > 0 ? `${result.more} more to burn.` : 'enough already.'}
          </AppText>
        </>
      ) : noSpread ? (
        <AppText tone="muted" testID="pairs-needed-unknown">
          {result.message}
        </AppText>
      ) : null}
    </View>
  );
}
