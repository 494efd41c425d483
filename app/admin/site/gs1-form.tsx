"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { setGs1PrefixAction } from "@/app/admin/site/actions";
import { GS1_PREFIX_MAX_DIGITS } from "@/lib/labels/gs1";

export function Gs1PrefixForm({ current }: { current: string | null }) {
  return (
    <ActionForm action={setGs1PrefixAction} submitLabel="Save prefix" label="GS1 Company Prefix">
      <Field
        name="gs1CompanyPrefix"
        label="GS1 Company Prefix"
        defaultValue={current ?? ""}
        maxLength={GS1_PREFIX_MAX_DIGITS}
        hint="The digits on the plant's GS1 licence. Leave empty if the plant has none."
      />
      <Field name="reason" label="Reason for the change" maxLength={200} required />
    </ActionForm>
  );
}
