import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { bindForm, useFormDraft } from '@/components/ui/use-form-draft';
import { useSignIn } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';
import { fieldErrors, signInBody } from '@/shared/schemas';

export default function SignIn() {
  const { draft, set, errors, setErrors } = useFormDraft(() => ({ email: '', password: '' }));
  const signIn = useSignIn();

  const submit = () => {
    const parsed = signInBody.safeParse({ ...draft, email: draft.email.trim() });
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    setErrors({});
    signIn.mutate(parsed.data);
  };
  const serverError = signIn.error;
  const serverFields = serverError instanceof ApiError ? serverError.fields : undefined;
  const { text } = bindForm(draft, set, { ...serverFields, ...errors });

  return (
    <Screen>
      <View style={styles.brand}>
        <Text variant="title" heading={1}>
          Ampwright
        </Text>
        <Text tone="soft">Panel schedules and condition records, on the job and offline.</Text>
      </View>
      <Card style={styles.card}>
        <TextField
          label="E-mail"
          {...text('email')}
          autoCapitalize="none"
          autoComplete="email"
          keyboardType="email-address"
          testID="sign-in-email"
        />
        <TextField
          label="Password"
          {...text('password')}
          secureTextEntry
          autoComplete="current-password"
          onSubmitEditing={submit}
          testID="sign-in-password"
        />
        {serverError && !serverFields && (
          <Text tone="danger" accessibilityRole="alert" testID="sign-in-error">
            {describeError(serverError)}
          </Text>
        )}
        <Button label="Sign in" onPress={submit} busy={signIn.isPending} testID="sign-in-submit" />
        <Link href="/forgot-password" style={styles.forgot} testID="forgot-password-link">
          <Text tone="copper">Forgot your password?</Text>
        </Link>
      </Card>
      <Text variant="small" tone="faint">
        Demo: admin@, electrician@, inspector@ or owner@ampwright.test with the password ampwright-demo.
      </Text>
    </Screen>
  );
}

const styles = StyleSheet.create({
  brand: { gap: space.xs, marginTop: space.xxl },
  forgot: { minHeight: 44, paddingVertical: space.md },
  card: {
    gap: space.lg,
  },
});
