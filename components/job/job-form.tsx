import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { z } from 'zod';

import { space } from '@/constants/theme';
import { parseNumberText } from '@/lib/number-draft';
import { jobCreateSchema, jobStatuses, jobStatusLabels, mileageSchema, type Job, type JobStatus } from '@/shared/jobs';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice } from '@/components/ui/query-state';

/** The form keeps mileage as typed text; it becomes a whole number (or blank) on submit. */
const jobFormSchema = jobCreateSchema.extend({
  mileage: z.preprocess((value) => (typeof value === 'string' ? parseNumberText(value, { count: true }) : value), mileageSchema.nullable()),
  findings: z.string().trim().max(8000, 'Keep it under 8000 characters'),
  status: z.enum(jobStatuses),
});
type JobFormInput = z.input<typeof jobFormSchema>;
export type JobFormValues = z.output<typeof jobFormSchema>;

const fieldNames = ['vehicle', 'customerName', 'complaint', 'mileage', 'findings', 'status'] as const;
const statusChoices = jobStatuses.map((value) => ({ value, label: jobStatusLabels[value] }));

type JobFormProps = {
  /** The job being edited; absent when creating one. */
  job?: Job;
  submitLabel: string;
  busy: boolean;
  onSubmit: (values: JobFormValues) => Promise<unknown>;
  onCancel?: () => void;
};

/** Create or edit a job's intake details. Server errors land on the field they name. */
export function JobForm({ job, submitLabel, busy, onSubmit, onCancel }: JobFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, reset } = useForm<JobFormInput, unknown, JobFormValues>({
    resolver: zodResolver(jobFormSchema),
    defaultValues: {
      vehicle: job?.vehicle ?? '',
      customerName: job?.customerName ?? '',
      complaint: job?.complaint ?? '',
      mileage: job?.mileage == null ? '' : String(job.mileage),
      findings: job?.findings ?? '',
      status: job?.status ?? 'intake',
    },
  });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(values);
      if (!job) reset();
    } catch (error) {
      setFormError(applyServerErrors(error, setError, fieldNames));
    }
  });

  return (
    <View style={styles.form}>
      <FormField control={control} name="vehicle" label="Vehicle" hint="Year range, body, engine: enough to find it in the lot." testID="job-vehicle" />
      <FormField control={control} name="customerName" label="Owner" testID="job-customer" />
      <FormField control={control} name="mileage" label="Odometer" unit="miles" keyboardType="numeric" testID="job-mileage" />
      <FormField control={control} name="complaint" label="Complaint" hint="What the owner reports, in their words." multiline testID="job-complaint" />
      {job ? (
        <>
          <FormField
            control={control}
            name="findings"
            label="Findings"
            hint="What teardown showed: failed parts, wear, debris."
            multiline
            testID="job-findings"
          />
          <Controller
            control={control}
            name="status"
            render={({ field }) => (
              <ChoiceGroup label="Stage" value={field.value as JobStatus} choices={statusChoices} onChange={field.onChange} testID="job-status" />
            )}
          />
        </>
      ) : null}
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      <View style={styles.actions}>
        <Button label={submitLabel} onPress={submit} busy={busy} testID="job-submit" />
        {onCancel ? <Button label="Cancel" variant="quiet" onPress={onCancel} testID="job-cancel" /> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
});
