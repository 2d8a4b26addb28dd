import { useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { formatCents, formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { copyText } from '@/lib/clipboard';
import {
  useAddOwnerOptionMutation,
  useCreateShareLinkMutation,
  useRemoveOwnerOptionMutation,
  useRevokeShareLinkMutation,
  useSaveOwnerOptionMutation,
  useOwnerDeskQuery,
  useSaveOwnerPageMutation,
  type NewShareLink,
} from '@/hooks/use-owner-page';
import { useJobSheetsQuery } from '@/hooks/use-sheets';
import { blankLink, blankOffer, linkDaysSpec, offerFieldPaths, offerNumberList, offerNumberSpecs, type LinkDraft, type OfferDraft } from '@/lib/offer-fields';
import { ownerOptionCreateSchema, shareLinkCreateSchema, type OwnerDesk, type OwnerOptionCreate, type ShareLink, type ShareLinkCreate } from '@/shared/owner';
import { calcUnits } from '@/state/units';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { DraftField, draftResolver } from '@/components/ui/number-field';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { TextField } from '@/components/ui/text-field';

const linkStateLabels: Record<ShareLink['state'], string> = { active: 'Open', expired: 'Expired', revoked: 'Withdrawn' };

/** On the job page: where the owner stands, and the way to the owner's page. */
export function OwnerSection({ jobId }: { jobId: string }) {
  const desk = useOwnerDeskQuery(jobId);
  return (
    <OwnerStatus desk={desk.data} error={desk.error} title="Owner">
      <Button label="Open the owner's page" variant="secondary" href={`/jobs/${jobId}/owner`} testID="open-owner-desk" />
    </OwnerStatus>
  );
}

/** Where the owner stands: approved what, and paid what, when. */
export function OwnerStatus({
  desk,
  error,
  title = "Owner's decision",
  children,
}: {
  desk: OwnerDesk | undefined;
  error?: Error | null;
  title?: string;
  children?: ReactNode;
}) {
  if (!desk) {
    return <Section title={title}>{error ? <ErrorNotice error={error} /> : <Pending label="Loading the owner's decision…" />}</Section>;
  }
  const paid = desk.payments.find((p) => p.state === 'paid');
  return (
    <Section title={title}>
      {desk.approval ? (
        <Text style={styles.body} testID="desk-approval">
          {desk.approval.name} approved “{desk.approval.optionTitle}” on {formatDateTime(desk.approval.at)} (sheet checksum{' '}
          <Text style={styles.mono}>{desk.approval.checksum}</Text>).
        </Text>
      ) : (
        <Text style={styles.body} testID="desk-approval">
          {desk.withdrawn
            ? `Approval withdrawn on ${formatDateTime(desk.withdrawn.at)}: ${desk.withdrawn.reason} The owner was e-mailed to approve again; offer them the current revision.`
            : 'Not approved yet.'}
        </Text>
      )}
      <Text style={[styles.body, paid && styles.paid]} testID="desk-payment">
        {paid
          ? `Deposit paid: ${formatCents(paid.amountCents, paid.currency)} on ${formatDateTime(paid.paidAt!)}.`
          : desk.payments.length
            ? 'Deposit started on the payment page, not paid yet.'
            : 'No deposit paid yet.'}
      </Text>
      {desk.payments
        .filter((p) => p.state === 'refund-due' || p.state === 'refunded')
        .map((p) => (
          <Text key={p.id} style={styles.body} testID="desk-second-payment">
            {p.state === 'refunded'
              ? `A second payment of ${formatCents(p.amountCents, p.currency)} was refunded to the owner automatically.`
              : `A second payment of ${formatCents(p.amountCents, p.currency)} needs a refund: the payment service did not take the refund; give it back from its dashboard.`}
          </Text>
        ))}
      {children}
    </Section>
  );
}

/** The builder's plain words about what failed; starts from the job's findings if empty. Key it by the desk version to pick up a newer save. */
export function OwnerWords({ jobId, desk, findings, canEdit }: { jobId: string; desk: OwnerDesk; findings: string; canEdit: boolean }) {
  const save = useSaveOwnerPageMutation(jobId);
  const [text, setText] = useState(desk.whatFailed);
  const error = save.error instanceof ApiError ? (save.error.fields.whatFailed ?? save.error.message) : save.error?.message;
  return (
    <Section title="What failed, in the owner's words">
      <Text style={styles.hint}>The owner sees this, never the job’s findings. Write it for someone outside the trade.</Text>
      <TextField label="What failed" value={text} onChangeText={setText} multiline editable={canEdit} error={error} testID="owner-what-failed-input" />
      {canEdit ? (
        <View style={styles.row}>
          <Button
            label="Save"
            busy={save.isPending}
            disabled={text.trim() === desk.whatFailed}
            onPress={() => save.mutate({ version: desk.version, whatFailed: text })}
            testID="owner-words-save"
          />
          {!text.trim() && findings ? (
            <Button label="Start from the findings" variant="quiet" onPress={() => setText(findings)} testID="owner-words-from-findings" />
          ) : null}
        </View>
      ) : null}
      {save.isSuccess && text.trim() === desk.whatFailed ? (
        <Text role="status" style={styles.saved}>
          Saved.
        </Text>
      ) : null}
    </Section>
  );
}

/** The options offered: each bound to a sheet revision, with the price, the deposit and the lead time. */
export function OwnerOptions({ jobId, desk, canEdit }: { jobId: string; desk: OwnerDesk; canEdit: boolean }) {
  const remove = useRemoveOwnerOptionMutation(jobId);
  const refresh = useSaveOwnerOptionMutation(jobId);
  const locked = Boolean(desk.approval);
  return (
    <Section title="Options for the owner">
      {desk.options.length === 0 ? <Text style={styles.body}>No options yet. Offer at least one spec sheet before sharing the page.</Text> : null}
      {desk.options.map((o, i) => (
        <View key={o.id} style={styles.option} testID={`desk-option-${i}`}>
          <Text style={styles.optionTitle}>
            {i + 1}. {o.title}
          </Text>
          <Text style={styles.body}>
            {formatCents(o.priceCents)} · deposit {formatCents(o.depositCents)} · about {o.leadTimeDays} days
          </Text>
          <Text style={styles.hint}>
            Sheet revision {o.revisionNumber}, checksum <Text style={styles.mono}>{o.checksum}</Text>
            {i === 0 ? ' · the owner sees the other options compared with this one' : ''}
          </Text>
          {o.stale ? (
            <Text style={styles.warn} role="alert">
              The sheet has a newer revision than the one the owner would approve.
            </Text>
          ) : null}
          {canEdit && !locked ? (
            <View style={styles.row}>
              {o.stale ? (
                <Button
                  label="Offer the newest revision"
                  variant="secondary"
                  busy={refresh.isPending}
                  onPress={() => refresh.mutate({ id: o.id, version: o.version, refreshRevision: true })}
                  testID={`desk-option-refresh-${i}`}
                />
              ) : null}
              <Button label="Remove" variant="danger" busy={remove.isPending} onPress={() => remove.mutate(o.id)} testID={`desk-option-remove-${i}`} />
            </View>
          ) : null}
        </View>
      ))}
      {locked ? <Text style={styles.hint}>The owner has approved, so the options stay as they were.</Text> : null}
      {canEdit && !locked ? <AddOption jobId={jobId} /> : null}
    </Section>
  );
}

function AddOption({ jobId }: { jobId: string }) {
  const sheets = useJobSheetsQuery(jobId);
  const add = useAddOwnerOptionMutation(jobId);
  const list = sheets.data ?? [];
  const form = useForm<OfferDraft, unknown, OwnerOptionCreate>({
    defaultValues: blankOffer(),
    resolver: draftResolver<OfferDraft, OwnerOptionCreate>(
      offerNumberList,
      ownerOptionCreateSchema,
      (v) => ({ sheetId: v.sheetId, title: v.title.trim() || list.find((s) => s.id === v.sheetId)?.current.label || '', ownerNote: v.ownerNote }),
      calcUnits,
    ),
  });
  const [refused, setRefused] = useState<string | null>(null);
  const sheetId = useWatch({ control: form.control, name: 'sheetId' });
  if (!list.length) return <Text style={styles.hint}>Start a spec sheet on this job to offer it.</Text>;
  const chosen = list.find((s) => s.id === sheetId);
  const submit = form.handleSubmit((option) => {
    setRefused(null);
    add.mutate(option, {
      onSuccess: () => form.reset(blankOffer()),
      onError: (error) => setRefused(applyServerErrors(error, form.setError, offerFieldPaths)),
    });
  });
  const numbers = { control: form.control, units: calcUnits, testPrefix: 'add-option' };
  return (
    <View style={styles.form} testID="add-owner-option">
      <Text style={styles.optionTitle}>Offer another option</Text>
      <Controller
        control={form.control}
        name="sheetId"
        render={({ field, fieldState }) => (
          <>
            <ChoiceGroup
              label="Spec sheet"
              value={field.value}
              choices={list.map((s) => ({ value: s.id, label: `${s.title} (rev ${s.current.number})` }))}
              onChange={field.onChange}
              testID="add-option-sheet"
            />
            {fieldState.error ? <Text style={styles.warn}>{fieldState.error.message}</Text> : null}
          </>
        )}
      />
      <FormField control={form.control} name="title" label="Name for the owner" placeholder={chosen?.current.label} testID="add-option-title" />
      <FormField control={form.control} name="ownerNote" label="A line for the owner" multiline testID="add-option-note" />
      <View style={styles.row}>
        <DraftField {...numbers} spec={offerNumberSpecs.price} testID="add-option-price" />
        <DraftField {...numbers} spec={offerNumberSpecs.deposit} testID="add-option-deposit" />
        <DraftField {...numbers} spec={offerNumberSpecs.leadTime} testID="add-option-days" />
      </View>
      <Button label="Offer this option" busy={add.isPending} disabled={!sheetId} onPress={submit} testID="add-option-submit" />
      {refused ? (
        <Text role="alert" style={styles.warn}>
          {refused}
        </Text>
      ) : null}
    </View>
  );
}

/** Links that open the owner's page without an account: make one (shown once), mail it, withdraw it. */
export function ShareLinks({ jobId, desk, canEdit }: { jobId: string; desk: OwnerDesk; canEdit: boolean }) {
  const create = useCreateShareLinkMutation(jobId);
  const revoke = useRevokeShareLinkMutation(jobId);
  const [made, setMade] = useState<NewShareLink | null>(null);
  const [copied, setCopied] = useState(false);
  const [refused, setRefused] = useState<string | null>(null);
  const form = useForm<LinkDraft, unknown, ShareLinkCreate>({
    defaultValues: blankLink(),
    resolver: draftResolver<LinkDraft, ShareLinkCreate>(
      [linkDaysSpec],
      shareLinkCreateSchema,
      (v) => (v.email.trim() ? { email: v.email.trim() } : {}),
      calcUnits,
    ),
  });
  const submit = form.handleSubmit((link) => {
    setRefused(null);
    create.mutate(link, {
      onSuccess: (r) => {
        setMade(r);
        setCopied(false);
      },
      onError: (error) => setRefused(applyServerErrors(error, form.setError, ['expiresInDays', 'email'])),
    });
  });
  const copy = async (url: string) => {
    const done = await copyText(url);
    if (done !== null) setCopied(done);
  };
  return (
    <Section title="Links for the owner">
      <Text style={styles.hint}>Anyone with a link can read the owner’s page, approve and pay, without an account. Send it only to the owner.</Text>
      {made ? (
        <View style={styles.made} testID="share-link-made">
          <Text style={styles.body}>
            {made.emailed ? `Sent to ${made.link.email}. ` : ''}Copy it now: Lobewright keeps only a fingerprint of it and cannot show it again.
          </Text>
          <Text selectable style={styles.url} testID="share-link-url">
            {made.url}
          </Text>
          <View style={styles.row}>
            <Button label={copied ? 'Copied' : 'Copy the link'} variant="secondary" onPress={() => copy(made.url)} testID="share-link-copy" />
          </View>
        </View>
      ) : null}
      {canEdit ? (
        <View style={styles.form}>
          <View style={styles.row}>
            <DraftField control={form.control} spec={linkDaysSpec} units={calcUnits} testPrefix="share-link" testID="share-link-days" />
            <FormField
              control={form.control}
              name="email"
              label="E-mail it to (optional)"
              hint="The owner also gets a customer account under this address"
              inputMode="email"
              autoComplete="email"
              testID="share-link-email"
            />
          </View>
          <Button label="Make a link" busy={create.isPending} disabled={desk.options.length === 0} onPress={submit} testID="share-link-create" />
          {refused ? (
            <Text role="alert" style={styles.warn}>
              {refused}
            </Text>
          ) : null}
        </View>
      ) : null}
      {desk.links.map((l) => (
        <View key={l.id} style={styles.linkRow} testID="share-link-row">
          <Text style={styles.body}>
            {linkStateLabels[l.state]} · made {formatDateTime(l.createdAt)} · until {formatDateTime(l.expiresAt)}
            {l.email ? ` · sent to ${l.email}` : ''}
            {l.lastOpenedAt ? ` · last opened ${formatDateTime(l.lastOpenedAt)}` : ' · not opened yet'}
          </Text>
          {canEdit && l.state === 'active' ? (
            <Button label="Withdraw" variant="danger" busy={revoke.isPending} onPress={() => revoke.mutate(l.id)} testID="share-link-revoke" />
          ) : null}
        </View>
      ))}
    </Section>
  );
}

const styles = StyleSheet.create({
  body: { ...typeScale.body, color: colors.ink },
  hint: { ...typeScale.small, color: colors.inkMuted },
  mono: { fontFamily: fonts.mono },
  paid: { color: colors.pass, fontFamily: fonts.semibold },
  saved: { ...typeScale.label, color: colors.pass },
  warn: { ...typeScale.label, color: colors.fail },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  option: { gap: space.xs, paddingVertical: space.md, borderTopWidth: 1, borderTopColor: colors.line },
  optionTitle: { ...typeScale.bodyStrong, color: colors.ink },
  form: { gap: space.md, paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.line },
  made: { gap: space.sm, padding: space.md, borderRadius: radius.md, backgroundColor: colors.accentSoft },
  url: { fontFamily: fonts.mono, fontSize: 14, color: colors.ink },
  linkRow: { gap: space.sm, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
});
