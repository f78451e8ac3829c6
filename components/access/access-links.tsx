/**
 * The pages behind the e-mailed links: accept an invitation (signed in or out), choose a new
 * password, and ask for a reset link (signed out).
 */
import { Link, Redirect, useRouter } from 'expo-router';
import { StyleSheet } from 'react-native';
import { useAcceptInvitation, useForgotPassword, useInvitation, usePasswordReset, useResetPassword } from '@/hooks/use-access';
import { useSession } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';
import {
  acceptInvitationBody,
  existingAccountAcceptBody,
  forgotPasswordBody,
  PASSWORD_MIN,
  resetPasswordBody,
  ROLE_LABELS,
  type AcceptInvitationRequest,
  type InvitationView,
} from '@/shared/access';
import type { z } from 'zod';
import { fieldErrors } from '@/shared/schemas';
import { AccessCard, Notice } from './access-parts';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/fields';
import { bindForm, useFormDraft } from '@/components/ui/use-form-draft';
import { LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

function LinkProblem({ error, what }: { error: unknown; what: 'invitation' | 'reset' }) {
  const code = error instanceof ApiError ? error.code : '';
  const title =
    code === 'used' ? 'This link has been used' : code === 'expired' ? 'This link has expired' : code === 'not_found' ? 'This link is not valid' : 'Could not open this link';
  return (
    <AccessCard testID="link-problem" accessibilityRole="alert">
      <Text variant="heading" heading={2}>{title}</Text>
      <Text tone="soft">{describeError(error)}</Text>
      <Link href={what === 'reset' ? '/forgot-password' : '/sign-in'} style={styles.link}>
        <Text tone="copper">{what === 'reset' ? 'Ask for a new link' : 'Go to sign-in'}</Text>
      </Link>
    </AccessCard>
  );
}

/**
 * The invitation link's page, signed in or out. A new address chooses a name and a password; an
 * address that already has an account confirms with that account's password (or with one tap
 * when signed in as it); signed in as someone else, it says to sign out first.
 */
export function AcceptInvitation({ token }: { token: string }) {
  const invitation = useInvitation(token);
  const session = useSession();
  if (invitation.isPending || session.isPending) return <LoadingState what="the invitation" />;
  const me = session.data?.user;
  // accepting signs in (and a new account remounts the app's cache): the used link then leads home
  const used = invitation.error instanceof ApiError && invitation.error.code === 'used';
  if (me && used) return <Redirect href="/" />;
  if (invitation.isError) return <LinkProblem error={invitation.error} what="invitation" />;
  const inv = invitation.data;
  if (me && me.email.toLowerCase() === inv.email.toLowerCase()) return <JoinAsSignedIn token={token} inv={inv} />;
  if (me) {
    return (
      <AccessCard testID="invitation-other-account" accessibilityRole="alert">
        <Text variant="heading" heading={2}>This invitation is for {inv.email}</Text>
        <Text tone="soft">
          You are signed in as {me.email}. Sign out first (under Me), then open the link again to join {inv.organisationName}.
        </Text>
        <Link href="/" style={styles.link}>
          <Text tone="copper">Back to the app</Text>
        </Link>
      </AccessCard>
    );
  }
  return inv.account === 'existing' ? <JoinWithPassword token={token} inv={inv} /> : <JoinAsNewAccount token={token} inv={inv} />;
}

type JoinProps = { token: string; inv: InvitationView };

function JoinAsSignedIn({ token, inv }: JoinProps) {
  const accept = useAcceptInvitation(token);
  const router = useRouter();
  return (
    <AccessCard testID="accept-invitation">
      <Text variant="heading" heading={2}>Join {inv.organisationName}</Text>
      <Text tone="soft">You were invited as {ROLE_LABELS[inv.role].toLowerCase()}. Your account and password stay as they are.</Text>
      {accept.error && <Notice tone="danger" text={describeError(accept.error)} testID="accept-error" />}
      <Button
        label={`Join ${inv.organisationName}`}
        onPress={() => accept.mutate({}, { onSuccess: () => router.replace('/') })}
        busy={accept.isPending}
        testID="accept-submit"
      />
    </AccessCard>
  );
}

/**
 * An invitation's form: checked like the server, then accepted (which signs in); the server's
 * field errors show under the fields until the user edits them.
 */
function useAcceptForm<T extends object>(token: string, initial: T, schema: z.ZodType<AcceptInvitationRequest>) {
  const accept = useAcceptInvitation(token);
  const router = useRouter();
  const { draft, set, errors, setErrors } = useFormDraft(() => initial);
  const serverFields = accept.error instanceof ApiError ? accept.error.fields : undefined;
  const submit = () => {
    const parsed = schema.safeParse(draft);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    accept.mutate(parsed.data, { onSuccess: () => router.replace('/') });
  };
  return { accept, serverFields, submit, ...bindForm(draft, set, { ...serverFields, ...errors }) };
}

function JoinWithPassword({ token, inv }: JoinProps) {
  const { accept, serverFields, submit, text } = useAcceptForm(token, { password: '' }, existingAccountAcceptBody);
  return (
    <AccessCard testID="accept-invitation">
      <Text variant="heading" heading={2}>Join {inv.organisationName}</Text>
      <Text tone="soft">
        You already use Ampwright with {inv.email}. Enter that account&apos;s password to join as {ROLE_LABELS[inv.role].toLowerCase()}; nothing
        else about your account changes.
      </Text>
      <TextField
        label="Your password"
        {...text('password')}
        secureTextEntry
        autoComplete="current-password"
        onSubmitEditing={submit}
        testID="invite-existing-password"
      />
      {accept.error && !serverFields && <Notice tone="danger" text={describeError(accept.error)} testID="accept-error" />}
      <Button label="Join and sign in" onPress={submit} busy={accept.isPending} testID="accept-submit" />
      <Link href="/forgot-password" style={styles.link}>
        <Text tone="copper">Forgot the password?</Text>
      </Link>
    </AccessCard>
  );
}

function JoinAsNewAccount({ token, inv }: JoinProps) {
  const { accept, serverFields, submit, text } = useAcceptForm(token, { name: '', password: '' }, acceptInvitationBody);
  return (
    <AccessCard testID="accept-invitation">
      <Text variant="heading" heading={2}>Join {inv.organisationName}</Text>
      <Text tone="soft">
        You were invited as {ROLE_LABELS[inv.role].toLowerCase()} with {inv.email}. Choose the name others will see and a password.
      </Text>
      <TextField
        label="Your name"
        {...text('name')}
        autoComplete="name"
        testID="invite-name"
      />
      <TextField
        label="Password"
        {...text('password')}
        secureTextEntry
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        onSubmitEditing={submit}
        testID="invite-password"
      />
      {accept.error && !serverFields && <Notice tone="danger" text={describeError(accept.error)} testID="accept-error" />}
      <Button label="Join and sign in" onPress={submit} busy={accept.isPending} testID="accept-submit" />
    </AccessCard>
  );
}

export function ResetPassword({ token }: { token: string }) {
  const reset = usePasswordReset(token);
  const save = useResetPassword(token);
  const { draft, set, errors, setErrors } = useFormDraft(() => ({ password: '' }));
  if (reset.isPending) return <LoadingState what="the link" />;
  if (reset.isError) return <LinkProblem error={reset.error} what="reset" />;
  const serverFields = save.error instanceof ApiError ? save.error.fields : undefined;
  const { text } = bindForm(draft, set, { ...serverFields, ...errors });
  const submit = () => {
    const parsed = resetPasswordBody.safeParse(draft);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    save.mutate(parsed.data.password);
  };
  return (
    <AccessCard testID="reset-password">
      <Text variant="heading" heading={2}>Choose a new password</Text>
      <Text tone="soft">For {reset.data.email}. Every device signed in with the old password is signed out.</Text>
      <TextField
        label="New password"
        {...text('password')}
        secureTextEntry
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        onSubmitEditing={submit}
        testID="reset-new-password"
      />
      {save.error && !serverFields && <Notice tone="danger" text={describeError(save.error)} />}
      <Button label="Save and sign in" onPress={submit} busy={save.isPending} testID="reset-submit" />
    </AccessCard>
  );
}

export function ForgotPassword() {
  const forgot = useForgotPassword();
  const { draft, setErrors, text } = useFormDraft(() => ({ email: '' }));
  const submit = () => {
    const parsed = forgotPasswordBody.safeParse({ email: draft.email.trim() });
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    forgot.mutate(parsed.data.email);
  };
  return (
    <AccessCard testID="forgot-password">
      <Text variant="heading" heading={2}>Forgot your password?</Text>
      <Text tone="soft">Enter the e-mail you sign in with. We send a link to choose a new password; it works once, for one hour.</Text>
      <TextField
        label="E-mail"
        {...text('email')}
        autoCapitalize="none"
        autoComplete="email"
        keyboardType="email-address"
        onSubmitEditing={submit}
        testID="forgot-email"
      />
      {forgot.isSuccess && <Notice text={forgot.data.message} testID="forgot-result" />}
      {forgot.error && <Notice tone="danger" text={describeError(forgot.error)} />}
      <Button label="Send the link" onPress={submit} busy={forgot.isPending} testID="forgot-submit" />
      <Link href="/sign-in" style={styles.link}>
        <Text tone="copper">Back to sign-in</Text>
      </Link>
    </AccessCard>
  );
}

const styles = StyleSheet.create({ link: { minHeight: 44, paddingVertical: space.md } });
