/**
 * The signed-out pages behind the e-mailed links: accept an invitation, choose a new password,
 * and ask for a reset link.
 */
import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useAcceptInvitation, useForgotPassword, useInvitation, usePasswordReset, useResetPassword } from '@/hooks/use-access';
import { ApiError, describeError } from '@/lib/api';
import { acceptInvitationBody, forgotPasswordBody, PASSWORD_MIN, resetPasswordBody, ROLE_LABELS } from '@/shared/access';
import { fieldErrors } from '@/shared/schemas';
import { card, Notice } from './access-parts';
import { Button } from './button';
import { TextField } from './fields';
import { LoadingState } from './states';
import { Text } from './text';
import { space } from './theme';

function LinkProblem({ error, what }: { error: unknown; what: 'invitation' | 'reset' }) {
  const code = error instanceof ApiError ? error.code : '';
  const title =
    code === 'used' ? 'This link has been used' : code === 'expired' ? 'This link has expired' : code === 'not_found' ? 'This link is not valid' : 'Could not open this link';
  return (
    <View style={card} testID="link-problem" accessibilityRole="alert">
      <Text variant="heading">{title}</Text>
      <Text tone="soft">{describeError(error)}</Text>
      <Link href={what === 'reset' ? '/forgot-password' : '/sign-in'} style={styles.link}>
        <Text tone="copper">{what === 'reset' ? 'Ask for a new link' : 'Go to sign-in'}</Text>
      </Link>
    </View>
  );
}

function clear(key: string) {
  return (errors: Record<string, string>) => {
    const { [key]: _gone, ...rest } = errors;
    return rest;
  };
}

export function AcceptInvitation({ token }: { token: string }) {
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  if (invitation.isPending) return <LoadingState what="the invitation" />;
  if (invitation.isError) return <LinkProblem error={invitation.error} what="invitation" />;
  const inv = invitation.data;
  const serverFields = accept.error instanceof ApiError ? accept.error.fields : undefined;
  const submit = () => {
    const parsed = acceptInvitationBody.safeParse({ name, password });
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    accept.mutate(parsed.data);
  };
  return (
    <View style={card} testID="accept-invitation">
      <Text variant="heading">Join {inv.organisationName}</Text>
      <Text tone="soft">
        You were invited as {ROLE_LABELS[inv.role].toLowerCase()} with {inv.email}. Choose the name others will see and a password.
      </Text>
      <TextField
        label="Your name"
        value={name}
        onChangeText={(v) => { setName(v); setErrors(clear('name')); }}
        autoComplete="name"
        error={errors.name ?? serverFields?.name}
        testID="invite-name"
      />
      <TextField
        label="Password"
        value={password}
        onChangeText={(v) => { setPassword(v); setErrors(clear('password')); }}
        secureTextEntry
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        onSubmitEditing={submit}
        error={errors.password ?? serverFields?.password}
        testID="invite-password"
      />
      {accept.error && !serverFields && <Notice tone="danger" text={describeError(accept.error)} testID="accept-error" />}
      <Button label="Join and sign in" onPress={submit} busy={accept.isPending} testID="accept-submit" />
    </View>
  );
}

export function ResetPassword({ token }: { token: string }) {
  const reset = usePasswordReset(token);
  const save = useResetPassword(token);
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  if (reset.isPending) return <LoadingState what="the link" />;
  if (reset.isError) return <LinkProblem error={reset.error} what="reset" />;
  const serverFields = save.error instanceof ApiError ? save.error.fields : undefined;
  const submit = () => {
    const parsed = resetPasswordBody.safeParse({ password });
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    save.mutate(parsed.data.password);
  };
  return (
    <View style={card} testID="reset-password">
      <Text variant="heading">Choose a new password</Text>
      <Text tone="soft">For {reset.data.email}. Every device signed in with the old password is signed out.</Text>
      <TextField
        label="New password"
        value={password}
        onChangeText={(v) => { setPassword(v); setErrors({}); }}
        secureTextEntry
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        onSubmitEditing={submit}
        error={errors.password ?? serverFields?.password}
        testID="reset-new-password"
      />
      {save.error && !serverFields && <Notice tone="danger" text={describeError(save.error)} />}
      <Button label="Save and sign in" onPress={submit} busy={save.isPending} testID="reset-submit" />
    </View>
  );
}

export function ForgotPassword() {
  const forgot = useForgotPassword();
  const [email, setEmail] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const submit = () => {
    const parsed = forgotPasswordBody.safeParse({ email: email.trim() });
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    forgot.mutate(parsed.data.email);
  };
  return (
    <View style={card} testID="forgot-password">
      <Text variant="heading">Forgot your password?</Text>
      <Text tone="soft">Enter the e-mail you sign in with. We send a link to choose a new password; it works once, for one hour.</Text>
      <TextField
        label="E-mail"
        value={email}
        onChangeText={(v) => { setEmail(v); setErrors({}); }}
        autoCapitalize="none"
        autoComplete="email"
        keyboardType="email-address"
        onSubmitEditing={submit}
        error={errors.email}
        testID="forgot-email"
      />
      {forgot.isSuccess && <Notice text={forgot.data.message} testID="forgot-result" />}
      {forgot.error && <Notice tone="danger" text={describeError(forgot.error)} />}
      <Button label="Send the link" onPress={submit} busy={forgot.isPending} testID="forgot-submit" />
      <Link href="/sign-in" style={styles.link}>
        <Text tone="copper">Back to sign-in</Text>
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({ link: { minHeight: 44, paddingVertical: space.md } });
