import type { InjectionKey, Ref } from 'vue'
import type { FieldErrors } from '~/utils/api-error'

/**
 * What a form hands the `<FormField name="…">` inside it (its messages, and who shows which)
 * and the `<FormSubmit>` that ends it (whether it is sending, and the message beside the button).
 * Kept apart from `useSchemaForm`, so a field outside any form (the board's filters, say) does
 * not load valibot and the form machinery with it.
 */
export interface SchemaFormContext {
  errors: Ref<FieldErrors>
  /** Notes that a field is on screen, so its message is shown beside it; returns the undo. */
  show: (field: string) => () => void
  submitting: Ref<boolean>
  formError: Ref<string>
}
export const SCHEMA_FORM: InjectionKey<SchemaFormContext> = Symbol('schema-form')
