import { StyleSheet } from 'react-native';
import { colors, space } from '../theme';

/** Rows of the wide-window tables (role="table"): a rule under each row, a heavier one under the head. */
export const tableStyles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    gap: space.sm,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.line,
  },
  head: { borderBottomWidth: 2, borderBottomColor: colors.ink },
  cell: { flex: 1 },
});
