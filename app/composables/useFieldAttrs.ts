/**
 * A field component's extra attributes, split: `class` places the whole field in its
 * form's grid (sm:col-span-2 ...), so it belongs on the frame; everything else
 * (data-testid, min, maxlength ...) belongs on the control itself.
 */
export function useFieldAttrs() {
  const attrs = useAttrs()
  const frameClass = computed(() => attrs.class)
  const controlAttrs = computed(() => {
    const { class: _placed, ...rest } = attrs
    return rest
  })
  return { frameClass, controlAttrs }
}
