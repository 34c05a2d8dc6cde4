import * as v from 'valibot'
import { getCurrentInstance, nextTick, provide, reactive, ref, toRaw, watch, type UnwrapNestedRefs } from 'vue'
import { apiErrorMessage, schemaFieldErrors, serverFieldErrors, type FieldErrors } from '~/utils/api-error'
import { SCHEMA_FORM } from '~/utils/schema-form-context'
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
  /**
   * The field that shows what no other field on screen shows (a refusal naming no field, a
   * message for a column not on screen yet): a form that is one file input says it all there.
   */
  catchAllField?: string
}

/** What to say beside the button (forms end with it) when some fields are marked. */
export const CHECK_FIELDS = 'Check the fields marked above.'

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
  // The last form set up in a component is the one its FormFields and FormSubmit report to.
  if (getCurrentInstance()) provide(SCHEMA_FORM, { errors, show, submitting, formError })
  /** Fields of `found` no field on screen shows; they go above the button instead (or beside the catch-all field). */
  const aside = (found: FieldErrors) => {
    const known = [...Object.keys(leaves(values)), ...[...onScreen].filter(([, n]) => n > 0).map(([field]) => field)]
    return unshownFields(found, known, fieldOf)
  }
  /** Puts messages on screen: each beside its field, the rest beside the catch-all field or above the button. */
  function mark(found: FieldErrors) {
    const stray = aside(found)
    const catchAll = options.catchAllField
    if (catchAll && stray.length) {
      const placed = Object.fromEntries(Object.entries(found).filter(([path]) => !stray.includes(path)))
      placed[catchAll] = [placed[catchAll], ...stray.map(path => found[path])].filter(Boolean).join(' ')
      errors.value = placed
      formError.value = CHECK_FIELDS
      return
    }
    errors.value = found
    formError.value = stray.map(path => found[path]).join(' ') || CHECK_FIELDS
  }

  // Synchronous, so a value set and checked in one go (a file chosen and sent at once) keeps the
  // messages that check found: a later flush would take them away as "changed".
  watch(() => leaves(values), (now, before) => {
    const changed = Object.keys(now).filter(key => now[key] !== before[key])
    if (changed.length) errors.value = withoutFields(errors.value, changed, fieldOf)
  }, { flush: 'sync' })

  /** Every message the schema and the extra checks find; the body to send when there is none. */
  function validate(): { ok: true, body: TBody } | { ok: false } {
    formError.value = ''
    const body = toBody(plain())
    const parsed = v.safeParse(typeof schema === 'function' ? schema(plain()) : schema, body)
    const found: FieldErrors = parsed.success ? {} : schemaFieldErrors(parsed.issues)
    for (const [field, message] of Object.entries(options.check?.(plain()) ?? {})) found[field] ??= message
    errors.value = found
    if (Object.keys(found).length) {
      mark(found)
      return { ok: false }
    }
    return { ok: true, body }
  }

  /** Shows a failed request: field messages beside their fields, anything else above the button. */
  function showServerError(error: unknown) {
    const fields = serverFieldErrors(error)
    const failure = () => apiErrorMessage(error, options.failure ?? 'That did not work. Try again.')
    if (fields) mark(fields)
    else if (options.catchAllField) mark({ [options.catchAllField]: failure() })
    else {
      errors.value = {}
      formError.value = failure()
    }
  }

  /**
   * Sends what one field holds the moment it is chosen (a photo stored before the form is
   * saved): `value` is checked with `schema` first, then `send` runs. A message from either
   * goes beside that field, whatever field the server named; the other fields' messages stay,
   * and focus moves to `control`. Resolves what `send` answered, or null when refused.
   */
  async function sendField<TValue, TResult>(field: string, schema: v.GenericSchema, value: TValue, send: (value: TValue) => Promise<TResult>, control?: HTMLElement | null): Promise<TResult | null> {
    const others = withoutFields(errors.value, [field])
    errors.value = others
    const refuse = async (message: string) => {
      errors.value = { ...others, [field]: message }
      await nextTick()
      control?.focus({ preventScroll: true })
      control?.scrollIntoView?.({ block: 'center' })
      return null
    }
    const parsed = v.safeParse(schema, value)
    if (!parsed.success) return refuse(parsed.issues[0].message)
    try {
      return await send(value)
    }
    catch (error) {
      const named = Object.values(serverFieldErrors(error) ?? {})
      return refuse(named.join(' ') || apiErrorMessage(error, options.failure ?? 'That did not work. Try again.'))
    }
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
        // Controls a form disables while sending take focus again only once it is over.
        submitting.value = false
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
  return reactive({ values, errors, formError, submitting, validate, showServerError, handleSubmit, sendField, reset, show })
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

/** Plain objects and arrays hold fields; anything else (a Date, a chosen File) is one value. */
function isPlain(value: unknown): value is object {
  if (!value || typeof value !== 'object') return false
  const proto = Object.getPrototypeOf(value)
  return Array.isArray(value) || proto === Object.prototype || proto === null
}

/** The values as leaf paths (`dims.lengthMm` -> 48) so a change can be traced to its field. */
export function leaves(value: unknown, prefix = '', out: Record<string, unknown> = {}): Record<string, unknown> {
  if (isPlain(value)) {
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
  return unshownFields(errors, known, fieldOf).map(path => errors[path]!)
}

/** The fields of those messages. */
export function unshownFields(errors: FieldErrors, known: readonly string[], fieldOf: (path: string) => string = p => p): string[] {
  const covers = (k: string, path: string) => k === path || path.startsWith(`${k}.`)
  const shown = (path: string) => known.some(k => covers(k, path) || covers(k, fieldOf(path)))
  return Object.keys(errors).filter(path => !shown(path))
}

/** A deep copy of plain values (arrays and objects), so the form never edits what it was given. */
function copy<T>(value: T): T {
  if (Array.isArray(value)) return value.map(copy) as T
  if (isPlain(value)) {
    return Object.fromEntries(Object.entries(value).map(([k, inner]) => [k, copy(inner)])) as T
  }
  return value
}
