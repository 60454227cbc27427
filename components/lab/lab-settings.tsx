import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { View } from 'react-native';
import { apiRequest } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { labKeys, useLabQuery } from '../api/labs';
import { space } from '../theme';
import { Banner } from '../ui/banner';
import { Button } from '../ui/button';
import { Card } from '../ui/card';
import { TextField } from '../ui/text-field';
import { AppText } from '../ui/text';
import { parseNumber, round } from '../units';

/** Managers set the weighing tolerance that new batches are checked against. */
export function LabSettings({ labId }: { labId: string }) {
  const lab = useLabQuery(labId);
  const client = useQueryClient();
  const [text, setText] = useState('');
  const save = useMutation({
    mutationFn: (weighTolerancePct: number) =>
      apiRequest(`/api/labs/${labId}/settings`, (k) => k.labSchema, {
        method: 'PATCH',
        body: { weighTolerancePct },
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: labKeys.lab(labId) }),
  });
  const current = lab.data?.weighTolerancePct;
  return (
    <Card title="Settings" testID="lab-settings">
      <AppText>
        Weighing tolerance: {current === undefined ? '…' : `±${round(current, 2)} %`}. Weighed
        masses further from the target are flagged on new batches.
      </AppText>
      <View style={{ gap: space.sm }}>
        <TextField
          label="New tolerance (%)"
          value={text}
          onChangeText={setText}
          inputMode="decimal"
          testID="tolerance"
        />
        {save.error ? <Banner tone="error" message={bannerMessage(save.error)} /> : null}
        <Button
          label="Save tolerance"
          tone="secondary"
          compact
          busy={save.isPending}
          onPress={() => {
            const n = parseNumber(text);
            if (n !== undefined) save.mutate(n, { onSuccess: () => setText('') });
          }}
          testID="save-tolerance"
        />
      </View>
    </Card>
  );
}
