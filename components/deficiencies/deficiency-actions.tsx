/**
 * What the signed-in role may do with a deficiency from where it stands (shared/deficiency.ts):
 * schedule, mark repaired with evidence, verify or reopen, defer with a reason and a review date,
 * take a deferral back, accept the repair plan, change the priority with a reason, assign, delete.
 * Every change is checked here with the same rules the server applies, so a refusal shows on the
 * field before anything is queued; the parent queues the patch (only the changed fields).
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import type { Role } from '@/shared/domain';
import { checkDeficiencyChange, dueOnFor, may, nextStatuses, todayISO, type DeficiencyAction } from '@/shared/deficiency';
import {
  DEFAULT_DUE_DAYS,
  deficiencyPatchBody,
  PRIORITIES,
  PRIORITY_LABELS,
  type Deficiency,
  type DeficiencyPatchBody,
  type Priority,
} from '@/shared/records';
import { fieldErrors } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { dateWords, isRealDate } from './deficiency-format';
import { DateField } from '@/components/ui/date-field';
import { ChoiceField, TextField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { can } from '@/shared/permissions';

type Person = { id: string; name: string; role: Role };
type Form = 'schedule' | 'repair' | 'defer' | 'reprioritise' | 'reopen' | 'assign' | null;

export interface DeficiencyActionsProps {
  deficiency: Deficiency;
  role: Role;
  people: readonly Person[];
  me: string | null;
  dueDays: Record<Priority, number> | undefined;
  /** repair photos of this deficiency on the device (evidence of a repair, like a note) */
  repairPhotos: number;
  onPatch: (patch: DeficiencyPatchBody) => void;
  /** with a note for the history (reopen: why) */
  onComment: (text: string) => void;
  onDelete: () => void;
}

/** Only the fields that differ from the stored row. */
function changedOnly(d: Deficiency, patch: DeficiencyPatchBody): DeficiencyPatchBody {
  const was: Record<string, unknown> = d;
  return Object.fromEntries(Object.entries(patch).filter(([k, v]) => was[k] !== v)) as DeficiencyPatchBody;
}

export function DeficiencyActions(props: DeficiencyActionsProps) {
  const { deficiency: d, role, people, me, repairPhotos } = props;
  const [form, setForm] = useState<Form>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [refused, setRefused] = useState<string | null>(null);
  const [assignee, setAssignee] = useState<string | null>(d.assigneeId);
  const [repairNote, setRepairNote] = useState(d.repairNote);
  const [deferReason, setDeferReason] = useState('');
  const [reviewOn, setReviewOn] = useState('');
  const [priority, setPriority] = useState<Priority>(d.priority);
  const [priorityReason, setPriorityReason] = useState('');
  const [reopenWhy, setReopenWhy] = useState('');

  const moves = nextStatuses(role, d.status);
  const canMove = (action: DeficiencyAction) => moves.find((m) => m.action === action);
  // the work goes to someone who may carry it out: repair it or verify the repair
  const assignable = people.filter((p) => can(p.role, 'deficiency.repair') || can(p.role, 'deficiency.verify'));
  const dueDays = props.dueDays ?? DEFAULT_DUE_DAYS;

  const open = (next: Form) => {
    setErrors({});
    setRefused(null);
    setForm((f) => (f === next ? null : next));
  };
  const clearError = (field: string) => setErrors(({ [field]: _gone, ...rest }) => rest);

  /** Check like the server, then queue. */
  const submit = (patch: DeficiencyPatchBody, extraErrors: Record<string, string> = {}) => {
    const changes = changedOnly(d, patch);
    const parsed = deficiencyPatchBody.safeParse(changes);
    const fields = { ...(parsed.success ? {} : fieldErrors(parsed.error)), ...extraErrors };
    if (parsed.success) {
      const check = checkDeficiencyChange({
        role,
        before: d,
        after: { ...d, ...parsed.data },
        changed: Object.keys(parsed.data),
        repairPhotos,
      });
      if (check.forbidden) {
        setRefused(check.forbidden);
        return false;
      }
      Object.assign(fields, check.fields, extraErrors);
    }
    setErrors(fields);
    if (Object.keys(fields).length > 0 || !parsed.success) return false;
    if (Object.keys(parsed.data).length > 0) props.onPatch(parsed.data);
    setForm(null);
    return true;
  };

  const assigneeChoices = [
    { value: null as string | null, label: 'Nobody yet' },
    ...assignable.map((p) => ({ value: p.id as string | null, label: `${p.name} (${p.id === me ? 'you' : p.role})` })),
  ];

  const buttons: React.ReactNode[] = [];
  const schedule = canMove('schedule');
  if (schedule?.to === 'scheduled') {
    buttons.push(<Button key="schedule" label="Schedule the repair" tone={form === 'schedule' ? 'primary' : 'secondary'} onPress={() => open('schedule')} testID="action-schedule" />);
  }
  if (canMove('repair')) {
    buttons.push(<Button key="repair" label="Mark repaired" tone={form === 'repair' ? 'primary' : 'secondary'} onPress={() => open('repair')} testID="action-repair" />);
  }
  if (canMove('verify')) {
    buttons.push(
      <Button key="verify" label="Verify the repair" tone="secondary" onPress={() => submit({ status: 'verified' })} testID="action-verify" />,
    );
  }
  if (canMove('reopen')) {
    buttons.push(<Button key="reopen" label="Reopen" tone={form === 'reopen' ? 'primary' : 'secondary'} onPress={() => open('reopen')} testID="action-reopen" />);
  }
  if (schedule?.to === 'open') {
    buttons.push(<Button key="unschedule" label="Back to open (not scheduled)" tone="secondary" onPress={() => submit({ status: 'open' })} testID="action-unschedule" />);
  }
  if (canMove('defer')) {
    buttons.push(<Button key="defer" label="Defer the repair" tone={form === 'defer' ? 'primary' : 'secondary'} onPress={() => open('defer')} testID="action-defer" />);
  }
  if (canMove('undefer')) {
    buttons.push(<Button key="undefer" label="Take back the deferral" tone="secondary" onPress={() => submit({ status: 'open' })} testID="action-undefer" />);
  }
  const acceptable = may(role, 'accept') && !d.acceptedAt && (d.status === 'open' || d.status === 'scheduled');
  if (acceptable) {
    buttons.push(
      <Button key="accept" label="Accept the repair plan" tone="secondary" onPress={() => submit({ acceptedAt: new Date().toISOString() })} testID="action-accept" />,
    );
  }
  const canAssign = may(role, 'assign') && d.status !== 'verified';
  if (canAssign) {
    buttons.push(<Button key="assign" label={d.assigneeId ? 'Change who does it' : 'Assign'} tone={form === 'assign' ? 'primary' : 'secondary'} onPress={() => open('assign')} testID="action-assign" />);
  }
  if (may(role, 'reprioritise') && d.status !== 'verified') {
    buttons.push(
      <Button key="priority" label="Change the priority" tone={form === 'reprioritise' ? 'primary' : 'secondary'} onPress={() => open('reprioritise')} testID="action-priority" />,
    );
  }

  const newDue = dueOnFor(priority, todayISO(), dueDays);

  return (
    <View style={styles.wrap} testID="deficiency-actions">
      {buttons.length === 0 ? (
        <Text tone="soft" testID="no-actions">
          {noActionWords(role, d)}
        </Text>
      ) : (
        <View style={styles.buttons}>{buttons}</View>
      )}
      {refused && (
        <Text tone="danger" accessibilityRole="alert" testID="action-refused">
          ✕ {refused}
        </Text>
      )}

      {form === 'schedule' && (
        <Card size="row" testID="form-schedule">
          <Text variant="strong">Schedule the repair</Text>
          <ChoiceField label="Who does it (optional)" choices={assigneeChoices} value={assignee} onChange={setAssignee} error={errors.assigneeId} />
          <Button label="Schedule" onPress={() => submit({ status: 'scheduled', assigneeId: assignee })} testID="confirm-schedule" />
        </Card>
      )}

      {form === 'repair' && (
        <Card size="row" testID="form-repair">
          <Text variant="strong">Mark repaired</Text>
          <Text variant="small" tone="soft">
            A repair needs evidence: say what was done here, or add a photo of the repair below
            {repairPhotos > 0 ? ` (${repairPhotos} repair photo${repairPhotos === 1 ? '' : 's'} on record)` : ''}.
          </Text>
          <TextField
            label="What was done"
            value={repairNote}
            onChangeText={(t) => {
              setRepairNote(t);
              clearError('repairNote');
            }}
            multiline
            error={errors.repairNote}
            placeholder="e.g. Re-terminated the lug, torqued to the maker's value"
            testID="field-repair-note"
          />
          <Button label="Mark repaired" onPress={() => submit({ status: 'repaired', repairNote })} testID="confirm-repair" />
        </Card>
      )}

      {form === 'reopen' && (
        <Card size="row" testID="form-reopen">
          <Text variant="strong">Reopen</Text>
          <TextField
            label="Why (goes into the history)"
            value={reopenWhy}
            onChangeText={setReopenWhy}
            multiline
            hint="Optional: e.g. still 30 °C over the neighbouring lug on the rescan."
            testID="field-reopen-why"
          />
          <Button
            label="Reopen"
            onPress={() => {
              if (submit({ status: 'open' }) && reopenWhy.trim()) props.onComment(`Reopened: ${reopenWhy.trim()}`);
            }}
            testID="confirm-reopen"
          />
        </Card>
      )}

      {form === 'defer' && (
        <Card size="row" testID="form-defer">
          <Text variant="strong">Defer the repair</Text>
          <Text variant="small" tone="soft">
            A deferral keeps the finding on record with your reason and a date to look at it again.
          </Text>
          <TextField
            label="Why it is deferred"
            required
            value={deferReason}
            onChangeText={(t) => {
              setDeferReason(t);
              clearError('deferReason');
            }}
            multiline
            error={errors.deferReason}
            testID="field-defer-reason"
          />
          <DateField
            label="Look at it again on"
            required
            value={reviewOn}
            onChangeText={(t) => {
              setReviewOn(t);
              clearError('reviewOn');
            }}
            min={todayISO()}
            error={errors.reviewOn}
            hint="For example the next planned shutdown."
            testID="field-review-on"
          />
          <Button
            label="Defer"
            onPress={() => {
              const extra: Record<string, string> = {};
              const date = reviewOn.trim();
              if (date && !isRealDate(date)) extra.reviewOn = 'a date as YYYY-MM-DD';
              else if (date && date < todayISO()) extra.reviewOn = 'choose a date from today on';
              submit({ status: 'deferred', deferReason: deferReason.trim(), reviewOn: date || null }, extra);
            }}
            testID="confirm-defer"
          />
        </Card>
      )}

      {form === 'assign' && (
        <Card size="row" testID="form-assign">
          <Text variant="strong">Who does it</Text>
          <ChoiceField label="Assigned to" choices={assigneeChoices} value={assignee} onChange={setAssignee} error={errors.assigneeId} />
          <Button label="Save" onPress={() => submit({ assigneeId: assignee })} testID="confirm-assign" />
        </Card>
      )}

      {form === 'reprioritise' && (
        <Card size="row" testID="form-priority">
          <Text variant="strong">Change the priority</Text>
          <ChoiceField
            label="Priority"
            choices={PRIORITIES.map((p) => ({ value: p, label: PRIORITY_LABELS[p] }))}
            value={priority}
            onChange={(p) => {
              setPriority(p);
              clearError('priority');
            }}
            error={errors.priority}
          />
          <Text variant="small" tone="soft" testID="new-due">
            {priority === d.priority
              ? `Still ${PRIORITY_LABELS[priority]}.`
              : `Due date moves to ${dateWords(newDue)} (${dueDays[priority]} days from today for ${PRIORITY_LABELS[priority]}).`}
          </Text>
          <TextField
            label="Why the priority changes"
            value={priorityReason}
            onChangeText={(t) => {
              setPriorityReason(t);
              clearError('priorityReason');
            }}
            multiline
            error={errors.priorityReason}
            testID="field-priority-reason"
          />
          <Button
            label="Change the priority"
            onPress={() => {
              if (priority === d.priority) {
                setErrors({ priority: 'choose a different priority' });
                return;
              }
              const extra: Record<string, string> = priorityReason.trim() ? {} : { priorityReason: 'say why the priority changes' };
              submit({ priority, priorityReason: priorityReason.trim(), dueOn: newDue }, extra);
            }}
            testID="confirm-priority"
          />
        </Card>
      )}

      {Object.keys(errors).length > 0 && (
        <Text tone="danger" accessibilityRole="alert" testID="action-errors">
          Nothing was changed: fix the fields marked ✕.
        </Text>
      )}

      {may(role, 'edit') && (
        <View style={styles.danger}>
          <Button label="Delete (raised by mistake)…" tone="quiet" onPress={props.onDelete} testID="action-delete" />
        </View>
      )}
    </View>
  );
}

function noActionWords(role: Role, d: Deficiency): string {
  if (d.status === 'verified') return 'Verified: the repair was checked. Nothing more to do unless it comes back.';
  // the words follow what this role may not do (shared/permissions.ts), not the role's name
  if (can(role, 'deficiency.accept')) return d.acceptedAt ? 'You accepted the repair plan. The contractor does the rest.' : 'Nothing for you to do here now.';
  if (d.status === 'repaired' && !can(role, 'deficiency.verify')) return 'Repaired: waiting for an inspector to verify it.';
  if (d.status === 'deferred' && !can(role, 'deficiency.undefer')) return 'Deferred by the owner: nothing to do until it is taken back.';
  return 'Nothing for your role to do at this stage.';
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  danger: {
    alignSelf: 'flex-start',
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.dangerSoft,
  },
});
