/** What FormField draws around a control: its label, note, hint and error. */
export interface FieldFrame {
  id: string
  label: string
  /** Soft text after the label in brackets: a unit, or "optional". */
  labelNote?: string
  /** Tells screen readers "(required)", for controls that do not carry the native attribute. */
  required?: boolean
  hint?: string
  error?: string
}

/**
 * A field component's frame and control attributes. The extra attributes are split:
 * `class` places the whole field in its form's grid (sm:col-span-2 ...), so it belongs
 * on the frame; everything else (data-testid, min, maxlength ...) belongs on the
 * control itself. Bind `<FormField v-slot="control" v-bind="frame">` and
 * `<input v-bind="{ ...controlAttrs, ...control }">`.
 */
export function useFieldAttrs(frameOf: () => FieldFrame) {
  const attrs = useAttrs()
  const frame = computed(() => {
    const { id, label, labelNote, required, hint, error } = frameOf()
    return { id, label, labelNote, required, hint, error, class: attrs.class }
  })
  const controlAttrs = computed(() => {
    const { class: _placed, ...rest } = attrs
    return rest
  })
  return { frame, controlAttrs }
}
