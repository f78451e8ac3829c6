/**
 * A calendar date (YYYY-MM-DD). On a phone build it is typed (the web build, the one that is run,
 * uses the browser's own date picker: date-field.web.tsx); both take the TextField binder's props
 * (`{...text('dueOn')}`), so a form does not care which.
 */
import { TextField } from './fields';

export interface DateFieldProps {
  label: string;
  value: string;
  onChangeText: (value: string) => void;
  error?: string;
  hint?: string;
  required?: boolean;
  /** earliest / latest date the picker offers (YYYY-MM-DD) */
  min?: string;
  max?: string;
  testID?: string;
}

export function DateField({ min: _min, max: _max, hint, ...props }: DateFieldProps) {
  return <TextField {...props} hint={hint ?? 'A date as YYYY-MM-DD.'} placeholder="YYYY-MM-DD" keyboardType="numbers-and-punctuation" mono />;
}
