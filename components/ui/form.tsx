import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import {
  Controller,
  useForm,
  type Control,
  type FieldValues,
  type Path,
  type UseFormReturn,
} from 'react-hook-form';
import { StyleSheet, View, type TextInputProps } from 'react-native';
import type { z } from 'zod';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { space } from '../theme';
import { Banner } from './banner';
import { TextField } from './text-field';

/** react-hook-form checked by the same shared zod schema the server uses. */
export function useZodForm<S extends z.ZodType<FieldValues, FieldValues>>(
  schema: S,
  defaultValues: z.input<S>,
): UseFormReturn<z.input<S>, unknown, z.output<S>> {
  return useForm<z.input<S>, unknown, z.output<S>>({
    resolver: zodResolver(schema as never) as never,
    defaultValues: defaultValues as never,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
}

/** Puts a server's field errors under their inputs; returns the text for the banner. */
export function serverErrorToForm<T extends FieldValues>(
  form: UseFormReturn<T, unknown, unknown>,
  error: unknown,
): string {
  if (error instanceof ApiError) {
    for (const field of error.fields) {
      form.setError(field.path as Path<T>, { type: 'server', message: field.message });
    }
  }
  return bannerMessage(error);
}

/**
 * A form's submit: checks with the schema, runs the action, and on failure puts the server's
 * field errors under their inputs and its message in the banner.
 */
export function useSubmit<TIn extends FieldValues, TOut>(
  form: UseFormReturn<TIn, unknown, TOut>,
  action: (values: TOut) => Promise<void>,
): { banner: string | undefined; submit: () => void } {
  const [banner, setBanner] = useState<string>();
  const handle = form.handleSubmit(async (values) => {
    setBanner(undefined);
    try {
      await action(values);
    } catch (err) {
      setBanner(serverErrorToForm(form, err));
    }
  });
  return { banner, submit: () => void handle() };
}

type FieldProps<T extends FieldValues> = Omit<TextInputProps, 'value' | 'onChangeText'> & {
  control: Control<T, unknown, unknown>;
  name: Path<T>;
  label: string;
  hint?: string;
};

export function FormTextField<T extends FieldValues>({
  control,
  name,
  label,
  hint,
  ...input
}: FieldProps<T>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          label={label}
          hint={hint}
          error={fieldState.error?.message}
          value={(field.value as string | undefined) ?? ''}
          onChangeText={field.onChange}
          onBlur={field.onBlur}
          ref={field.ref}
          testID={`field-${name}`}
          {...input}
        />
      )}
    />
  );
}

/** A form's column: banner on top, fields, then the actions. */
export function FormStack({ banner, children }: { banner?: string; children: ReactNode }) {
  return (
    <View style={styles.stack}>
      {banner ? <Banner tone="error" message={banner} testID="form-banner" /> : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({ stack: { gap: space.lg } });
