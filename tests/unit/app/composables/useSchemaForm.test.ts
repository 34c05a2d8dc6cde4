import * as v from 'valibot'
import { createSSRApp, defineComponent, h, inject, nextTick } from 'vue'
import { renderToString } from 'vue/server-renderer'
import { describe, expect, it } from 'vitest'
import { CHECK_FIELDS, leaves, unshown, useSchemaForm, withoutFields } from '../../../../app/composables/useSchemaForm'
import { SCHEMA_FORM } from '../../../../app/utils/schema-form-context'
import type { FieldErrors } from '../../../../app/utils/api-error'
import { MAX_UPLOAD_BYTES, uploadFileSchema, uploadTooLargeMessage } from '../../../../shared/uploads/files'

const ClientSchema = v.object({
  name: v.pipe(v.string(), v.trim(), v.minLength(1, 'Give the client a name.')),
  email: v.pipe(v.string(), v.email('Enter an e-mail address.')),
  notes: v.optional(v.string()),
})
const blank = () => ({ name: '', email: '', notes: '' })
const failed = (data: unknown) => Object.assign(new Error('request failed'), { data })

/** Stands in for the form element: remembers which control was focused. */
function fakeForm(invalidId: string | null) {
  const focused: string[] = []
  const form = {
    querySelector: (selector: string) => (selector === '[aria-invalid="true"]' && invalidId
      ? { focus: () => focused.push(invalidId), scrollIntoView: () => undefined }
      : null),
  }
  return { event: { currentTarget: form } as unknown as Event, focused }
}

describe('useSchemaForm', () => {
  it('reports every field the schema refuses at once, and sends nothing', async () => {
    const form = useSchemaForm(ClientSchema, blank())
    const sent: unknown[] = []
    const ok = await form.handleSubmit(async body => sent.push(body))()
    expect(ok).toBe(false)
    expect(sent).toEqual([])
    expect(form.errors).toEqual({ name: 'Give the client a name.', email: 'Enter an e-mail address.' })
    expect(form.formError).toBe(CHECK_FIELDS)
  })

  it('adds the checks a schema cannot make to the same list', () => {
    const form = useSchemaForm(ClientSchema, { ...blank(), email: 'a@b.test' }, {
      check: (values): FieldErrors => (values.notes === '' ? { notes: 'Say something.' } : {}),
    })
    expect(form.validate().ok).toBe(false)
    expect(form.errors).toEqual({ name: 'Give the client a name.', notes: 'Say something.' })
  })

  it('sends the body built from the values and reports the submit state while it waits', async () => {
    const form = useSchemaForm(ClientSchema, { name: 'Ada', email: 'ada@example.test', notes: '' }, {
      toBody: values => ({ ...values, name: values.name.toUpperCase() }),
    })
    let release!: () => void
    const sent: unknown[] = []
    const pending = form.handleSubmit(body => new Promise<void>((resolve) => {
      sent.push(body)
      release = resolve
    }))()
    expect(form.submitting).toBe(true)
    release()
    expect(await pending).toBe(true)
    expect(form.submitting).toBe(false)
    expect(sent).toEqual([{ name: 'ADA', email: 'ada@example.test', notes: '' }])
    expect(form.errors).toEqual({})
  })

  it('puts the server\'s field messages beside their fields, and the rest above the button', async () => {
    const form = useSchemaForm(ClientSchema, { name: 'Ada', email: 'ada@example.test', notes: '' }, { fieldOf: { emailAddress: 'email' } })
    await form.handleSubmit(async () => {
      throw failed({ statusMessage: 'Validation Error', data: { issues: [{ field: 'emailAddress', message: 'That e-mail is taken.' }, { field: '(body)', message: 'Too many fields.' }] } })
    })()
    expect(form.errors).toEqual({ 'emailAddress': 'That e-mail is taken.', '(body)': 'Too many fields.' })
    expect(form.formError).toBe('Too many fields.')
  })

  it('shows the server\'s own message when it names no field, or the form\'s fallback', async () => {
    const form = useSchemaForm(ClientSchema, { name: 'Ada', email: 'ada@example.test', notes: '' }, { failure: 'The client could not be saved.' })
    await form.handleSubmit(async () => { throw failed({ statusMessage: 'Client archived' }) })()
    expect(form.formError).toBe('Client archived')
    await form.handleSubmit(async () => { throw new TypeError('fetch failed') })()
    expect(form.formError).toBe('The client could not be saved.')
  })

  it('forgets a field\'s message when its value changes and keeps the others', async () => {
    const form = useSchemaForm(ClientSchema, blank())
    form.validate()
    form.values.name = 'Ada'
    await nextTick()
    expect(form.errors).toEqual({ email: 'Enter an e-mail address.' })
  })

  it('moves focus to the first field marked invalid, after a refusal of either kind', async () => {
    const form = useSchemaForm(ClientSchema, blank())
    const local = fakeForm('client-name')
    await form.handleSubmit(async () => undefined)(local.event)
    expect(local.focused).toEqual(['client-name'])
    Object.assign(form.values, { name: 'Ada', email: 'ada@example.test' })
    const server = fakeForm('client-email')
    await form.handleSubmit(async () => {
      throw failed({ data: { issues: [{ field: 'email', message: 'That e-mail is taken.' }] } })
    })(server.event)
    expect(server.focused).toEqual(['client-email'])
  })

  it('checks against the schema the values pick when one form sends to two routes', async () => {
    // Acknowledging takes an optional note; resolving needs one (the alert row's two actions).
    const Optional = v.object({ note: v.optional(v.string()) })
    const Required = v.object({ note: v.pipe(v.string(), v.minLength(3, 'Say why.')) })
    let resolving = false
    const form = useSchemaForm(() => (resolving ? Required : Optional), { note: '' })
    const sent: unknown[] = []
    const send = form.handleSubmit(async body => sent.push(body))
    expect(await send()).toBe(true)
    resolving = true
    expect(await send()).toBe(false)
    expect(form.errors).toEqual({ note: 'Say why.' })
    expect(sent).toEqual([{ note: '' }])
  })

  it('never edits the values it was given, and resets to them', () => {
    const start = { name: 'Ada', email: '', notes: '', tags: ['reef'] }
    const form = useSchemaForm(ClientSchema, start)
    form.values.name = 'Grace'
    form.values.tags.push('fowlr')
    expect(start).toEqual({ name: 'Ada', email: '', notes: '', tags: ['reef'] })
    form.validate()
    form.reset()
    expect(form.values).toEqual(start)
    expect(form.errors).toEqual({})
  })
})

describe('what a form hands the fields and the button inside it', () => {
  /** Renders a form component whose child reads the form's context as a FormSubmit does. */
  const clientForm = () => useSchemaForm(ClientSchema, blank())
  async function seenInside(setUp: (form: ReturnType<typeof clientForm>) => void) {
    const Inside = defineComponent(() => {
      const form = inject(SCHEMA_FORM, null)
      return () => h('p', `${form ? form.submitting.value : 'no form'}|${form?.formError.value ?? ''}`)
    })
    const Form = defineComponent(() => {
      setUp(clientForm())
      return () => h(Inside)
    })
    return renderToString(createSSRApp(Form))
  }

  it('its sending state and the message beside the button', async () => {
    expect(await seenInside(() => undefined)).toBe('<p>false|</p>')
    expect(await seenInside(form => form.validate())).toBe(`<p>false|${CHECK_FIELDS}</p>`)
    // Filled in well, so the request goes out and never comes back while the page is drawn.
    expect(await seenInside((form) => {
      Object.assign(form.values, { name: 'Ada', email: 'ada@example.test' })
      void form.handleSubmit(() => new Promise(() => undefined))()
    })).toBe('<p>true|</p>')
  })
})

describe('a file field', () => {
  const png = (bytes: number, name = 'strip.png') => new File([new Uint8Array(bytes)], name, { type: 'image/png' })

  it('holds a chosen File as one value, checks it, and forgets its message the moment another is chosen', async () => {
    const form = useSchemaForm(uploadFileSchema(), { file: null as File | null })
    const sent: unknown[] = []
    const send = form.handleSubmit(async body => sent.push(body))
    const big = png(MAX_UPLOAD_BYTES + 1)
    form.values.file = big
    // Set and checked in one go: the check's message stays (the change came before it).
    expect(await send()).toBe(false)
    expect(form.errors).toEqual({ file: uploadTooLargeMessage() })
    expect(form.values.file).toBe(big)
    form.values.file = png(10)
    expect(form.errors).toEqual({})
    expect(await send()).toBe(true)
    expect((sent[0] as { file: File }).file.name).toBe('strip.png')
  })

  it('names an empty file, a missing one and a wrong kind', async () => {
    const form = useSchemaForm(uploadFileSchema(), { file: null as File | null })
    expect(form.validate().ok).toBe(false)
    expect(form.errors).toEqual({ file: 'Choose a file to upload.' })
    form.values.file = png(0)
    form.validate()
    expect(form.errors).toEqual({ file: 'The file is empty.' })
    form.values.file = new File(['a,b'], 'tests.csv', { type: 'text/csv' })
    form.validate()
    expect(form.errors.file).toBe('Only JPEG, PNG or WebP photos and PDF documents can be added here.')
  })

  it('with a catch-all field, says beside it what no other field on screen shows', async () => {
    const form = useSchemaForm(ClientSchema, { name: 'Ada', email: 'ada@example.test', notes: '' }, { catchAllField: 'name' })
    await form.handleSubmit(async () => { throw failed({ statusMessage: 'The tank was signed off while the file was being read.' }) })()
    expect(form.errors).toEqual({ name: 'The tank was signed off while the file was being read.' })
    expect(form.formError).toBe(CHECK_FIELDS)
    await form.handleSubmit(async () => {
      throw failed({ data: { issues: [{ field: 'email', message: 'Taken.' }, { field: 'mapping.takenAt', message: 'Choose the date column.' }] } })
    })()
    expect(form.errors).toEqual({ email: 'Taken.', name: 'Choose the date column.' })
  })

  it('sendField: checks one value, sends it, and puts a refusal of either kind beside that field, keeping the others', async () => {
    const form = useSchemaForm(ClientSchema, blank())
    form.validate()
    const focused: string[] = []
    const control = { focus: () => focused.push('photo'), scrollIntoView: () => undefined } as unknown as HTMLElement
    const sent: unknown[] = []
    const send = async (value: { file: File }) => { sent.push(value.file.name); return { id: 'u1' } }
    expect(await form.sendField('photoUploadId', uploadFileSchema(), { file: png(MAX_UPLOAD_BYTES + 1) }, send, control)).toBeNull()
    expect(sent).toEqual([])
    expect(form.errors.photoUploadId).toBe(uploadTooLargeMessage())
    expect(form.errors.name).toBe('Give the client a name.')
    expect(focused).toEqual(['photo'])
    const refused = await form.sendField('photoUploadId', uploadFileSchema(), { file: png(10) }, async () => {
      throw failed({ statusMessage: 'Unsupported file', data: { issues: [{ field: 'file', message: 'Not a picture.' }] } })
    }, control)
    expect(refused).toBeNull()
    expect(form.errors.photoUploadId).toBe('Not a picture.')
    expect(await form.sendField('photoUploadId', uploadFileSchema(), { file: png(10) }, send, control)).toEqual({ id: 'u1' })
    expect(form.errors.photoUploadId).toBeUndefined()
    expect(form.errors.email).toBe('Enter an e-mail address.')
  })
})

describe('the pieces', () => {
  it('leaves: nested values by path', () => {
    expect(leaves({ a: 1, b: { c: '', d: { e: null } }, f: [] })).toEqual({ 'a': 1, 'b.c': '', 'b.d.e': null })
    // A chosen file is one value, not an object of fields.
    const file = new File(['x'], 'x.png')
    expect(leaves({ upload: { file } })).toEqual({ 'upload.file': file })
  })
  it('withoutFields: a changed field takes its children\'s messages and its parent\'s', () => {
    const errors = { 'dims': 'Enter the dimensions.', 'dims.lengthMm': 'Too long.', 'name': 'Name it.' }
    expect(withoutFields(errors, ['dims.lengthMm'])).toEqual({ name: 'Name it.' })
    expect(withoutFields(errors, ['sump'], p => (p === 'sumpLitres' ? 'sump' : p))).toBe(errors)
    expect(withoutFields({ sumpLitres: 'Too big.' }, ['sump'], p => (p === 'sumpLitres' ? 'sump' : p))).toEqual({})
  })
  it('unshown: messages for fields no input shows', () => {
    expect(unshown({ 'name': 'a', 'dims.lengthMm': 'b', '(body)': 'c', 'sumpLitres': 'd' }, ['name', 'dims', 'sump'], p => (p === 'sumpLitres' ? 'sump' : p))).toEqual(['c'])
  })
})
