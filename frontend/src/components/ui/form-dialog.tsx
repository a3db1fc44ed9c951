import { zodResolver } from '@hookform/resolvers/zod';
import Button from '@mui/material/Button';
import Dialog, { type DialogProps } from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormLabel from '@mui/material/FormLabel';
import MenuItem from '@mui/material/MenuItem';
import Radio from '@mui/material/Radio';
import RadioGroup from '@mui/material/RadioGroup';
import Stack from '@mui/material/Stack';
import Switch from '@mui/material/Switch';
import TextField, { type TextFieldProps } from '@mui/material/TextField';
import { useEffect, useId, useRef, type ReactNode } from 'react';
import {
  Controller,
  useForm,
  type Control,
  type DefaultValues,
  type FieldPath,
  type FieldValues,
  type SubmitHandler,
  type UseFormReturn,
} from 'react-hook-form';
import type { z } from 'zod';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';

/**
 * A react-hook-form form checked by a zod schema: the form holds the schema's input, submit gets its output.
 * `values` (for edit forms) follows the record: when it changes, the form shows the new values.
 */
export function useZodForm<S extends z.ZodType<unknown, FieldValues>>(schema: S, defaultValues: DefaultValues<z.input<S>>, values?: z.input<S>) {
  return useForm<z.input<S>, unknown, z.output<S>>({
    resolver: zodResolver(schema as never) as never,
    defaultValues,
    values,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
  });
}

/** The server's messages for a failed request, or one fallback line when it gave none. */
export function serverMessages(error: unknown, fallback: string, keep: (message: string) => boolean = () => true) {
  if (error instanceof ApiError) return error.messages.filter(keep);
  return error ? [fallback] : [];
}

const FIRST_FIELD = 'input:not([type="hidden"]):not([aria-hidden="true"]):not([tabindex="-1"]), textarea, [role="combobox"]';

type FormDialogProps<TIn extends FieldValues, TOut> = {
  open: boolean;
  title: ReactNode;
  form: UseFormReturn<TIn, unknown, TOut>;
  onSubmit: SubmitHandler<TOut>;
  onClose: () => void;
  /** Called once the dialog has faded out (the form is reset then); reset the mutation here. */
  onExited?: () => void;
  pending: boolean;
  /** The failed request's error: an ApiError's messages are listed, anything else shows `errorFallback`. */
  error?: unknown;
  errorFallback?: string;
  /** Server messages shown elsewhere (e.g. under their field) are left out of the list. */
  keepMessage?: (message: string) => boolean;
  /** Text above the fields (a caution or what the form does). */
  intro?: ReactNode;
  submitLabel: string;
  pendingLabel: string;
  submitColor?: 'primary' | 'error' | 'warning';
  /** Shown but not changeable (no submit button; Cancel reads Close). */
  readOnly?: boolean;
  maxWidth?: DialogProps['maxWidth'];
  /** The fields; laid out in a column unless `layout="custom"` (grids and tables bring their own). */
  children: ReactNode;
  layout?: 'stack' | 'custom';
};

/**
 * The one form dialog: title, optional intro, fields, the server's refusal, Cancel and a submit button.
 * Enter submits (a real form), Esc and the backdrop cancel unless a request is on its way, the first
 * field takes the focus, and the dialog fills a phone's width (the theme makes dialogs full width).
 */
export function FormDialog<TIn extends FieldValues, TOut>(props: FormDialogProps<TIn, TOut>) {
  const titleId = useId();
  const { open, form, pending, onClose, onExited, maxWidth } = props;
  return (
    <Dialog
      open={open}
      onClose={pending ? undefined : onClose}
      aria-labelledby={titleId}
      maxWidth={maxWidth}
      slotProps={{
        transition: {
          onExited: () => {
            form.reset();
            onExited?.();
          },
        },
      }}
    >
      <FormDialogBody {...props} titleId={titleId} />
    </Dialog>
  );
}

function FormDialogBody<TIn extends FieldValues, TOut>(props: FormDialogProps<TIn, TOut> & { titleId: string }) {
  const { form, onSubmit, onClose, pending, error, errorFallback, keepMessage, intro, title, titleId } = props;
  const formRef = useRef<HTMLFormElement>(null);
  // Runs before MUI's focus trap looks for focus, so the first field keeps it (as `autoFocus` would).
  useEffect(() => {
    const first = [...(formRef.current?.querySelectorAll<HTMLElement>(FIRST_FIELD) ?? [])].find(
      (element) => !element.hasAttribute('disabled') && element.getAttribute('aria-disabled') !== 'true',
    );
    first?.focus();
  }, []);
  const messages = serverMessages(error, errorFallback ?? 'The request failed. Try again.', keepMessage);
  // A problem with the form as a whole (the schema's issue at path ['root']), e.g. "Nothing is changed yet".
  const formProblem = form.formState.errors.root?.message;
  return (
    <form ref={formRef} noValidate onSubmit={(event) => void form.handleSubmit(onSubmit)(event)}>
      <DialogTitle id={titleId}>{title}</DialogTitle>
      <DialogContent>
        {intro && (
          <DialogContentText component="div" sx={{ mb: 2 }}>
            {intro}
          </DialogContentText>
        )}
        <FormErrors messages={formProblem ? [formProblem, ...messages] : messages} />
        {props.layout === 'custom' ? (
          props.children
        ) : (
          <Stack spacing={2} sx={{ pt: 1 }}>
            {props.children}
          </Stack>
        )}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose} disabled={pending}>
          {props.readOnly ? 'Close' : 'Cancel'}
        </Button>
        {!props.readOnly && (
          <Button type="submit" variant="contained" color={props.submitColor ?? 'primary'} disabled={pending}>
            {pending ? props.pendingLabel : props.submitLabel}
          </Button>
        )}
      </DialogActions>
    </form>
  );
}

type FieldProps<T extends FieldValues, TOut> = { control: Control<T, unknown, TOut>; name: FieldPath<T> };

/** Called after the user changes the field, for what else a change means (clearing a server refusal, a dependent field). */
type FieldChange = { onValueChange?: (value: string) => void };

/** A TextField bound to a form field: the schema's message replaces the helper text while it stands. */
export function FormTextField<T extends FieldValues, TOut>({
  control,
  name,
  helperText,
  onValueChange,
  ...rest
}: FieldProps<T, TOut> & FieldChange & Omit<TextFieldProps, 'name' | 'value' | 'onChange' | 'onBlur'>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          {...rest}
          name={field.name}
          value={field.value ?? ''}
          onChange={(event) => {
            field.onChange(event.target.value);
            onValueChange?.(event.target.value);
          }}
          onBlur={field.onBlur}
          inputRef={field.ref}
          error={Boolean(fieldState.error) || Boolean(rest.error)}
          helperText={fieldState.error?.message ?? helperText}
        />
      )}
    />
  );
}

export type FormOption = { value: string; label: ReactNode; disabled?: boolean };

/** A select (MUI TextField `select`) bound to a string form field. */
export function FormSelectField<T extends FieldValues, TOut>({
  options,
  ...rest
}: FieldProps<T, TOut> &
  FieldChange & { options: readonly FormOption[] } & Omit<TextFieldProps, 'name' | 'value' | 'onChange' | 'onBlur' | 'select' | 'children'>) {
  return (
    <FormTextField {...rest} select>
      {options.map((option) => (
        <MenuItem key={option.value} value={option.value} disabled={option.disabled}>
          {option.label}
        </MenuItem>
      ))}
    </FormTextField>
  );
}

/** A switch with its label, bound to a boolean form field. */
export function FormSwitch<T extends FieldValues, TOut>({ control, name, label, disabled }: FieldProps<T, TOut> & { label: ReactNode; disabled?: boolean }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <FormControlLabel
          label={label}
          disabled={disabled}
          control={<Switch checked={Boolean(field.value)} onChange={(event) => field.onChange(event.target.checked)} />}
        />
      )}
    />
  );
}

/** A row of radio buttons with a group label, bound to a string form field. */
export function FormRadioGroup<T extends FieldValues, TOut>({
  control,
  name,
  label,
  options,
}: FieldProps<T, TOut> & { label: ReactNode; options: readonly FormOption[] }) {
  const labelId = useId();
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => (
        <FormControl>
          <FormLabel id={labelId}>{label}</FormLabel>
          <RadioGroup row aria-labelledby={labelId} value={field.value} onChange={(event) => field.onChange(event.target.value)}>
            {options.map((option) => (
              <FormControlLabel key={option.value} value={option.value} control={<Radio size="small" />} label={option.label} disabled={option.disabled} />
            ))}
          </RadioGroup>
        </FormControl>
      )}
    />
  );
}
