/**
 * False until the page is interactive. Forms keep their submit button disabled
 * until then: a click before hydration would send the form natively, without
 * our validation and error handling.
 */
export function useHydrated() {
  const hydrated = ref(false)
  onMounted(() => {
    hydrated.value = true
  })
  return hydrated
}
