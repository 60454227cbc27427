import { useState, type ReactNode } from 'react';
import {
  Controller,
  useForm,
  type Resolver,
  type Control,
  type FieldValues,
  type Path,
  type UseFormReturn,
} from 'react-hook-form';
import { StyleSheet, View, type TextInputProps } from 'react-native';
import type { z } from 'zod';
import { ApiError } from '../api/client';
import { bannerMessage } from '../api/error-messages';
import { loadSchemaKit, type SchemaPick } from '../schemas';
import { space } from '../theme';
import { Banner } from './banner';
import { TextField } from './text-field';

/**
 * A resolver that checks with a schema of the lazily loaded kit (components/schemas.ts): the
 * first check of a form waits for the kit, every later one finds it loaded.
 */
export function kitResolver<S extends z.ZodType<FieldValues, FieldValues>>(
  pick: SchemaPick<S>,
): Resolver<z.input<S>, unknown, z.output<S>> {
  return async (values, context, options) => {
    const kit = await loadSchemaKit();
    const resolve = kit.zodResolver(pick(kit) as never) as unknown as Resolver<
      z.input<S>,
      unknown,
      z.output<S>
    >;
    return resolve(values, context, options);
  };
}

/** react-hook-form checked by the same shared zod schema the server uses, e.g. `(k) => k.signInSchema`. */
export function useZodForm<S extends z.ZodType<FieldValues, FieldValues>>(
  pick: SchemaPick<S>,
  defaultValues: z.input<S>,
): UseFormReturn<z.input<S>, unknown, z.output<S>> {
  const [resolver] = useState(() => kitResolver(pick));
  return useForm<z.input<S>, unknown, z.output<S>>({
    resolver,
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
