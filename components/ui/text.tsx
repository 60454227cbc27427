import { Text, type TextProps } from 'react-native';
import { colors, type, type TypeVariant } from '../theme';

type Props = TextProps & { variant?: TypeVariant; tone?: 'ink' | 'muted' | 'danger' | 'ok' };

export function AppText({ variant = 'body', tone = 'ink', style, ...rest }: Props) {
  return <Text {...rest} style={[type[variant], { color: colors[tone] }, style]} />;
}
