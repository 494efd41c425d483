"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { changeCustomerAction, createCustomerAction } from "@/app/customers/actions";

/** A new customer: a short code of the site's choosing, the name as it goes on the shipping papers. */
export function NewCustomerForm() {
  return (
    <ActionForm action={createCustomerAction} submitLabel="Record the customer" label="New customer">
      <Field name="code" label="Customer code" hint="Short and unique, e.g. HHC; letters, digits and - . / _" />
      <Field name="name" label="Name" hint="As it is printed on the shipping document" />
      <Field name="address" label="Delivery address" type="textarea" />
      <Field name="contact" label="Contact" hint="Who receives the fuel, and how to reach them" />
    </ActionForm>
  );
}

/** Changes a customer; the previous values stay in the record's history with the reason. */
export function ChangeCustomerForm({
  customer,
}: {
  customer: { code: string; name: string; address: string; contact: string; active: boolean };
}) {
  return (
    <ActionForm
      action={changeCustomerAction}
      submitLabel="Save the change"
      label={`Change customer ${customer.code}`}
      hidden={{ code: customer.code }}
      keepValues
    >
      <Field name="name" label="Name" defaultValue={customer.name} />
      <Field name="address" label="Delivery address" type="textarea" defaultValue={customer.address} />
      <Field name="contact" label="Contact" defaultValue={customer.contact} />
      <Field
        name="active"
        label="Still supplied (untick to stop shipments to this customer)"
        type="checkbox"
        defaultValue={customer.active ? "yes" : ""}
      />
      <Field name="reason" label="Reason for the change" />
    </ActionForm>
  );
}
