import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/fields';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { useSignIn } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';
import { fieldErrors, signInBody } from '@/shared/schemas';

export default function SignIn() {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const signIn = useSignIn();

  const submit = () => {
    const parsed = signInBody.safeParse({ email: email.trim(), password });
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    setErrors({});
    signIn.mutate(parsed.data);
  };
  const serverError = signIn.error;
  const serverFields = serverError instanceof ApiError ? serverError.fields : undefined;

  return (
    <Screen>
      <View style={styles.brand}>
        <Text variant="title">Ampwright</Text>
        <Text tone="soft">Panel schedules and condition records, on the job and offline.</Text>
      </View>
      <Card style={styles.card}>
        <TextField
          label="E-mail"
          value={email}
          onChangeText={(v) => { setEmail(v); setErrors(({ email: _e, ...rest }) => rest); }}
          autoCapitalize="none"
          autoComplete="email"
          keyboardType="email-address"
          error={errors.email ?? serverFields?.email}
          testID="sign-in-email"
        />
        <TextField
          label="Password"
          value={password}
          onChangeText={(v) => { setPassword(v); setErrors(({ password: _p, ...rest }) => rest); }}
          secureTextEntry
          autoComplete="current-password"
          onSubmitEditing={submit}
          error={errors.password ?? serverFields?.password}
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
