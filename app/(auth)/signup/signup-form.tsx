"use client";
import { useActionState } from "react";
import { FormError, SubmitButton, TextField } from "@/app/_components/form";
import { signUpAction, type SignUpState } from "./actions";

export function SignUpForm() {
  const [state, action, pending] = useActionState<SignUpState, FormData>(signUpAction, { errors: {} });
  const v = state.values ?? {};
  return (
    <form action={action} noValidate aria-label="Set up your organisation">
      <FormError message={state.formError} />
      <TextField name="name" label="Your name" autoComplete="name" error={state.errors.name} defaultValue={v.name} />
      <TextField
        name="email"
        label="E-mail"
        type="email"
        autoComplete="email"
        error={state.errors.email}
        defaultValue={v.email}
      />
      <TextField
        name="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        error={state.errors.password}
        hint="At least 10 characters."
      />
      <TextField
        name="organisation"
        label="Farm business or company"
        error={state.errors.organisation}
        defaultValue={v.organisation}
      />
      <fieldset className="mb-6">
        <legend className="mb-1 text-sm font-medium">We are a</legend>
        <label className="mr-6 text-sm">
          <input type="radio" name="kind" value="farm" defaultChecked={v.kind !== "contractor"} className="mr-1" />
          farm business
        </label>
        <label className="text-sm">
          <input
            type="radio"
            name="kind"
            value="contractor"
            defaultChecked={v.kind === "contractor"}
            className="mr-1"
          />
          field-services contractor
        </label>
        {state.errors.kind ? (
          <p role="alert" className="mt-1 text-sm text-alarm">
            {state.errors.kind}
          </p>
        ) : null}
      </fieldset>
      <SubmitButton pending={pending}>Create account</SubmitButton>
    </form>
  );
}
