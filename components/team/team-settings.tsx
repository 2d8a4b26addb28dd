import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { colors, space, type as typeScale } from '@/constants/theme';
import { useChangeRoleMutation, useInviteMutation, useRemoveMemberMutation, useTeamQuery, useWithdrawInvitationMutation } from '@/hooks/use-team';
import { roleLabels, type ShopRole } from '@/shared/roles';
import { inviteSchema, type InviteInput, type Team, type TeamInvitation, type TeamMember } from '@/shared/team';

import { Button } from '@/components/ui/button';
import { listRow } from '@/components/ui/list-row';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice, Pending } from '@/components/ui/query-state';

const dateOnly = (iso: string) => new Date(iso).toLocaleDateString(undefined, { year: 'numeric', month: 'short', day: 'numeric' });
const roleChoices = (roles: ShopRole[]) => roles.map((r) => ({ value: r, label: roleLabels[r] }));

/**
 * The shop's team, for the people who manage it: who works here and in what role, who has been
 * invited, and a form to invite someone by e-mail. A removed person loses access on their next request.
 */
export function TeamSettings() {
  const team = useTeamQuery();
  if (team.isPending) return <Pending label="Loading the team…" />;
  if (team.isError) return <ErrorNotice error={team.error} onRetry={() => team.refetch()} />;
  return (
    <View style={styles.team} testID="team-settings">
      <View role="list" aria-label="Team members" style={styles.list}>
        {team.data.members.map((member) => (
          <MemberRow key={member.id} member={member} roles={team.data.roles} />
        ))}
      </View>
      <Invitations invitations={team.data.invitations} />
      <InviteForm team={team.data} />
    </View>
  );
}

function MemberRow({ member, roles }: { member: TeamMember; roles: ShopRole[] }) {
  const changeRole = useChangeRoleMutation();
  const remove = useRemoveMemberMutation();
  const [confirming, setConfirming] = useState(false);
  const testID = `member-${member.email}`;
  return (
    <View role="listitem" style={styles.row} testID={testID}>
      <View style={styles.who}>
        <Text style={styles.name}>
          {member.name}
          {member.you ? ' (you)' : ''}
        </Text>
        <Text style={styles.meta}>
          {member.email} · {roleLabels[member.role]} since {dateOnly(member.joinedAt)}
        </Text>
      </View>
      {member.you ? null : (
        <View style={styles.actions}>
          {roles.length > 1 ? (
            <ChoiceGroup
              label={`Role of ${member.name}`}
              value={changeRole.isPending && changeRole.variables ? changeRole.variables.role : member.role}
              choices={roleChoices(roles)}
              onChange={(role) => changeRole.mutate({ memberId: member.id, role })}
              testID={`${testID}-role`}
            />
          ) : null}
          {confirming ? (
            <View style={styles.confirm}>
              <Text style={styles.meta}>{member.name} loses access to this shop at once.</Text>
              <View style={styles.buttons}>
                <Button label="Remove" variant="danger" busy={remove.isPending} onPress={() => remove.mutate(member.id)} testID={`${testID}-remove-confirm`} />
                <Button label="Keep" variant="secondary" onPress={() => setConfirming(false)} testID={`${testID}-remove-cancel`} />
              </View>
            </View>
          ) : (
            <Button label="Remove from the team" variant="secondary" onPress={() => setConfirming(true)} testID={`${testID}-remove`} />
          )}
          {changeRole.isError ? <ErrorNotice error={changeRole.error} /> : null}
          {remove.isError ? <ErrorNotice error={remove.error} /> : null}
        </View>
      )}
    </View>
  );
}

function Invitations({ invitations }: { invitations: TeamInvitation[] }) {
  const withdraw = useWithdrawInvitationMutation();
  if (invitations.length === 0) return null;
  return (
    <View style={styles.list}>
      <Text role="heading" aria-level={3} style={styles.subhead}>
        Waiting to join
      </Text>
      <View role="list" aria-label="Open invitations" style={styles.list}>
        {invitations.map((invitation) => (
          <View role="listitem" key={invitation.id} style={styles.row} testID={`invitation-${invitation.email}`}>
            <View style={styles.who}>
              <Text style={styles.name}>{invitation.email}</Text>
              <Text style={styles.meta}>
                {roleLabels[invitation.role]} · invited{invitation.invitedBy ? ` by ${invitation.invitedBy}` : ''} · open until {dateOnly(invitation.expiresAt)}
              </Text>
            </View>
            <Button
              label="Withdraw"
              variant="secondary"
              busy={withdraw.isPending && withdraw.variables === invitation.id}
              onPress={() => withdraw.mutate(invitation.id)}
              testID={`invitation-${invitation.email}-withdraw`}
            />
          </View>
        ))}
      </View>
      {withdraw.isError ? <ErrorNotice error={withdraw.error} /> : null}
    </View>
  );
}

function InviteForm({ team }: { team: Team }) {
  const invite = useInviteMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { control, handleSubmit, setError, reset } = useForm<InviteInput>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: '', role: team.defaultRole },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    setSentTo(null);
    try {
      await invite.mutateAsync(values);
      setSentTo(values.email);
      reset({ email: '', role: values.role });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email', 'role']));
    }
  });
  return (
    <View style={styles.form}>
      <Text role="heading" aria-level={3} style={styles.subhead}>
        Invite someone
      </Text>
      <Text style={styles.meta}>They get an e-mail with a link. Once they sign in with that address and verify it, they join with the role you choose.</Text>
      <FormField control={control} name="email" label="Their e-mail" keyboardType="email-address" autoComplete="off" testID="invite-email" />
      {team.roles.length > 1 ? (
        <Controller
          control={control}
          name="role"
          render={({ field }) => (
            <ChoiceGroup label="Role" value={field.value} choices={roleChoices(team.roles)} onChange={field.onChange} testID="invite-role" />
          )}
        />
      ) : null}
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      {sentTo ? (
        <Text style={styles.sent} role="status" testID="invite-sent">
          Invitation sent to {sentTo}.
        </Text>
      ) : null}
      <Button label="Send invitation" onPress={submit} busy={invite.isPending} testID="invite-submit" />
    </View>
  );
}

const styles = StyleSheet.create({
  team: { gap: space.md },
  list: { gap: space.sm },
  row: { ...listRow },
  who: { flexGrow: 1, flexShrink: 1, flexBasis: 220, gap: 2 },
  name: { ...typeScale.bodyStrong, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  actions: { flexGrow: 1, flexBasis: 260, gap: space.sm },
  confirm: { gap: space.xs },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  subhead: { ...typeScale.heading, color: colors.ink },
  form: { gap: space.sm, maxWidth: 520 },
  sent: { ...typeScale.bodyStrong, color: colors.pass },
});
