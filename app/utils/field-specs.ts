import type { Choice } from '~/utils/choices'

/** What a `<FormField>` holds: text, a number from a number input, or nothing yet. */
export type FieldValue = string | number | null | undefined

/**
 * One field of a form declared as data, for `<FormFieldList>`: the key of the value it edits,
 * its control's id and label, and what it passes on to the control (bounds, a hint, a message,
 * choices for a select). A form whose fields differ only in these lists them once in its script.
 */
export interface FieldSpec {
  key: string
  id: string
  label: string
  /** The field's name in a `useSchemaForm` form, so its message shows beside it. */
  name?: string
  type?: 'number' | 'text' | 'time' | 'datetime-local'
  inputmode?: 'decimal'
  min?: number
  max?: number
  step?: number | 'any'
  maxlength?: number
  hint?: string
  error?: string | null
  choices?: readonly Choice[]
  labelClass?: string
}
