import * as v from 'valibot'
import { getCurrentInstance, nextTick, provide, reactive, ref, toRaw, watch, type InjectionKey, type Ref, type UnwrapNestedRefs } from 'vue'
import { apiErrorMessage, schemaFieldErrors, serverFieldErrors, type FieldErrors } from '~/utils/api-error'
import { useToastStore } from '~/stores/toasts'

export interface SchemaFormOptions<TValues, TBody> {
  /** The request body built from the values (units converted, blanks to null); the values themselves by default. */
  toBody?: (values: TValues) => TBody
  /** Checks the schema cannot make (two passwords alike, a dimension the shape needs): field -> message. */
  check?: (values: TValues) => FieldErrors
  /** The form value a body field belongs to when they are named apart (`sumpLitres` -> `sump`). */
  fieldOf?: Record<string, string>
  /** What to say when the server refuses without naming a field. */
  failure?: string
  /** The toast once the request went through ("Client saved.", or words made from the body sent); none when not given. */
  saved?: string | ((body: TBody) => string)
}

/** What to say beside the button (forms end with it) when some fields are marked. */
export const CHECK_FIELDS = 'Check the fields marked above.'

/** What a form hands the `<FormField name="…">` inside it: its messages, and who shows which. */
export interface SchemaFormContext {
  errors: Ref<FieldErrors>
  /** Notes that a field is on screen, so its message is shown beside it; returns the undo. */
  show: (field: string) => () => void
}
export const SCHEMA_FORM: InjectionKey<SchemaFormContext> = Symbol('schema-form')

/**
 * A form driven by the shared valibot schema its API route uses (or, where one form sends to
 * two routes, a function of the values that picks the schema). It checks every field at once
 * before sending, shows the server's per-field messages next to the same fields, forgets a
 * field's message as soon as its value changes, and moves focus to the first field marked.
 *
 *   const form = useSchemaForm(ClientCreateSchema, { name: '', email: '' })
 *   const save = form.handleSubmit(body => $fetch('/api/clients', { method: 'POST', body }))
 *   <form novalidate @submit.prevent="save"> <FormField v-model="form.values.name" name="name" …>
 */
export function useSchemaForm<TSchema extends v.GenericSchema, TValues extends object, TBody extends object = TValues>(
  schema: TSchema | ((values: TValues) => v.GenericSchema),
  initial: TValues,
  options: SchemaFormOptions<TValues, TBody> = {},
) {
  const values = reactive(copy(initial)) as UnwrapNestedRefs<TValues>
  const plain = () => values as TValues
  const errors = ref<FieldErrors>({})
  const formError = ref('')
  const submitting = ref(false)
  const toBody = options.toBody ?? ((current: TValues) => toRaw(current) as unknown as TBody)
  const fieldOf = (path: string) => options.fieldOf?.[path] ?? path
  // Taken while the component is set up: after an await there is no active Pinia context to find.
  const toasts = options.saved ? useToastStore() : null
  const onScreen = new Map<string, number>()
  const show = (field: string) => {
    onScreen.set(field, (onScreen.get(field) ?? 0) + 1)
    return () => onScreen.set(field, (onScreen.get(field) ?? 1) - 1)
  }
  // The last form set up in a component is the one its FormFields report to.
  if (getCurrentInstance()) provide(SCHEMA_FORM, { errors, show })
  /** Messages no field on screen shows; they go above the button instead. */
  const aside = (found: FieldErrors) => {
    const known = [...Object.keys(leaves(values)), ...[...onScreen].filter(([, n]) => n > 0).map(([field]) => field)]
    return unshown(found, known, fieldOf)
  }

  watch(() => leaves(values), (now, before) => {
    const changed = Object.keys(now).filter(key => now[key] !== before[key])
    if (changed.length) errors.value = withoutFields(errors.value, changed, fieldOf)
  })

  /** Every message the schema and the extra checks find; the body to send when there is none. */
  function validate(): { ok: true, body: TBody } | { ok: false } {
    formError.value = ''
    const body = toBody(plain())
    const parsed = v.safeParse(typeof schema === 'function' ? schema(plain()) : schema, body)
    const found: FieldErrors = parsed.success ? {} : schemaFieldErrors(parsed.issues)
    for (const [field, message] of Object.entries(options.check?.(plain()) ?? {})) found[field] ??= message
    errors.value = found
    if (Object.keys(found).length) {
      formError.value = aside(found).join(' ') || CHECK_FIELDS
      return { ok: false }
    }
    return { ok: true, body }
  }

  /** Shows a failed request: field messages beside their fields, anything else above the button. */
  function showServerError(error: unknown) {
    const fields = serverFieldErrors(error)
    errors.value = fields ?? {}
    formError.value = fields
      ? aside(fields).join(' ') || CHECK_FIELDS
      : apiErrorMessage(error, options.failure ?? 'That did not work. Try again.')
  }

  /**
   * The submit handler: validates, then runs `send` with the body; a failure is shown on the
   * form. Resolves true when `send` went through. Pass it the submit event so focus can move.
   */
  function handleSubmit(send: (body: TBody) => Promise<unknown>) {
    return async (event?: Event): Promise<boolean> => {
      const root = formOf(event)
      const checked = validate()
      if (!checked.ok) {
        await focusFirstInvalid(root)
        return false
      }
      submitting.value = true
      try {
        await send(checked.body)
        if (options.saved) toasts?.say(typeof options.saved === 'function' ? options.saved(checked.body) : options.saved)
        return true
      }
      catch (error) {
        showServerError(error)
        await focusFirstInvalid(root)
        return false
      }
      finally {
        submitting.value = false
      }
    }
  }

  /** Back to the starting values (or new ones), with no messages. */
  function reset(next: TValues = initial) {
    Object.assign(values, copy(next))
    errors.value = {}
    formError.value = ''
  }

  // One reactive object, so templates read `form.errors.name` and `form.submitting` directly.
  return reactive({ values, errors, formError, submitting, validate, showServerError, handleSubmit, reset, show })
}

/** The form a submit event came from (its listener sits on the form). */
function formOf(event: Event | undefined): ParentNode | null {
  const target = event?.currentTarget ?? event?.target
  return target && typeof (target as ParentNode).querySelector === 'function' ? target as ParentNode : null
}

/** Focuses and scrolls to the first control marked invalid once the messages are on screen. */
export async function focusFirstInvalid(root: ParentNode | null): Promise<void> {
  if (!root) return
  await nextTick()
  const field = root.querySelector<HTMLElement>('[aria-invalid="true"]')
  if (!field) return
  field.focus({ preventScroll: true })
  field.scrollIntoView?.({ block: 'center' })
}

/** The values as leaf paths (`dims.lengthMm` -> 48) so a change can be traced to its field. */
export function leaves(value: unknown, prefix = '', out: Record<string, unknown> = {}): Record<string, unknown> {
  if (value && typeof value === 'object' && !(value instanceof Date)) {
    for (const [key, inner] of Object.entries(value)) leaves(inner, prefix ? `${prefix}.${key}` : key, out)
  }
  else if (prefix) out[prefix] = value
  return out
}

/** The messages left once the changed fields' own (and their children's) are gone. */
export function withoutFields(errors: FieldErrors, changed: readonly string[], fieldOf: (path: string) => string = p => p): FieldErrors {
  const belongs = (path: string, field: string) => path === field || path.startsWith(`${field}.`) || field.startsWith(`${path}.`)
  const kept = Object.entries(errors).filter(([path]) => !changed.some(field => belongs(path, field) || belongs(fieldOf(path), field)))
  return kept.length === Object.keys(errors).length ? errors : Object.fromEntries(kept)
}

/** Messages for fields no input shows (the whole body, a field only the server checks). */
export function unshown(errors: FieldErrors, known: readonly string[], fieldOf: (path: string) => string = p => p): string[] {
  const covers = (k: string, path: string) => k === path || path.startsWith(`${k}.`)
  const shown = (path: string) => known.some(k => covers(k, path) || covers(k, fieldOf(path)))
  return Object.entries(errors).filter(([path]) => !shown(path)).map(([, message]) => message)
}

/** A deep copy of plain values (arrays and objects), so the form never edits what it was given. */
function copy<T>(value: T): T {
  if (Array.isArray(value)) return value.map(copy) as T
  if (value && typeof value === 'object' && !(value instanceof Date)) {
    return Object.fromEntries(Object.entries(value).map(([k, inner]) => [k, copy(inner)])) as T
  }
  return value
}
