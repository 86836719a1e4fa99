// The shared pieces the workspace and account pages are built from (issue 20 item 4):
// a table's header row from its column list, the edit form's save line and conflict
// dialog, the account form that its answer replaces, and a field's frame wiring.
// Mounted in Nuxt's test environment (happy-dom).
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { defineComponent, h } from 'vue'
import TableData from '~/components/table/TableData.vue'
import BenchEditForm from '~/components/bench/BenchEditForm.vue'
import AuthAnsweredForm from '~/components/auth/AuthAnsweredForm.vue'
import FormSelectField from '~/components/form/FormSelectField.vue'
import FormTextField from '~/components/form/FormTextField.vue'

const noConflict = { what: 'setup', open: false, fields: [], kept: [] }

describe('TableData', () => {
  it('writes one column header per entry, figures right-aligned, hidden ones for screen readers only', async () => {
    const wrapper = await mountSuspended(TableData, {
      props: { label: 'Pulls', columns: ['Setup', { label: 'Pulls', right: true }, { label: 'Actions', hidden: true }], caption: 'All pulls', testid: 'pulls' },
      slots: { default: () => h('tr', [h('td', { class: 'cell' }, 'A')]) },
    })
    const heads = wrapper.findAll('thead th')
    expect(heads.map(th => th.text())).toEqual(['Setup', 'Pulls', 'Actions'])
    expect(heads.every(th => th.attributes('scope') === 'col')).toBe(true)
    expect(heads[1]!.classes()).toContain('text-right')
    expect(heads[0]!.classes()).not.toContain('text-right')
    expect(heads[2]!.find('.sr-only').text()).toBe('Actions')
    // The last column keeps no gap after it.
    expect(heads[1]!.classes()).toContain('pr-3')
    expect(heads[2]!.classes()).not.toContain('pr-3')
    expect(wrapper.find('caption').text()).toBe('All pulls')
    expect(wrapper.find('table').attributes('data-testid')).toBe('pulls')
    expect(wrapper.find('tbody td').text()).toBe('A')
  })

  it('leaves out the header row when the rows name themselves, and tightens dense rows', async () => {
    const wrapper = await mountSuspended(TableData, { props: { label: 'Specifications', dense: true } })
    expect(wrapper.find('thead').exists()).toBe(false)
    expect(wrapper.find('caption').exists()).toBe(false)
    expect(wrapper.find('table').classes()).toContain('table-dense')
  })
})

describe('BenchEditForm', () => {
  it('says the failure beside the save button, and submits once per press', async () => {
    const wrapper = await mountSuspended(BenchEditForm, {
      props: { busy: false, failure: 'The setup could not be saved. Try again.', saveLabel: 'Save setup', saveTestid: 'setup-save', conflict: noConflict },
      slots: { default: () => h('input', { id: 'x' }) },
    })
    expect(wrapper.get('[role="alert"]').text()).toBe('The setup could not be saved. Try again.')
    const save = wrapper.get('[data-testid="setup-save"]')
    expect(save.text()).toBe('Save setup')
    await wrapper.get('form').trigger('submit')
    expect(wrapper.emitted('submit')).toHaveLength(1)
  })

  it('disables saving while the request runs', async () => {
    const wrapper = await mountSuspended(BenchEditForm, {
      props: { busy: true, saveLabel: 'Save setup', saveTestid: 'setup-save', conflict: noConflict },
    })
    expect(wrapper.get('[data-testid="setup-save"]').attributes('disabled')).toBeDefined()
    expect(wrapper.find('[role="alert"]').exists()).toBe(false)
  })
})

describe('AuthAnsweredForm', () => {
  const withBoth = (answered: boolean) => mountSuspended(AuthAnsweredForm, {
    props: { answered, answerTestid: 'sent' },
    slots: { default: () => h('input', { id: 'email' }), answer: () => 'A mail is on its way.' },
  })

  it('shows the fields until it is answered', async () => {
    const wrapper = await withBoth(false)
    expect(wrapper.find('form input#email').exists()).toBe(true)
    expect(wrapper.find('[data-testid="sent"]').exists()).toBe(false)
  })

  it('gives way to the answer once sent', async () => {
    const wrapper = await withBoth(true)
    expect(wrapper.find('form').exists()).toBe(false)
    expect(wrapper.get('[data-testid="sent"]').text()).toBe('A mail is on its way.')
    expect(wrapper.get('[data-testid="sent"]').attributes('role')).toBe('status')
  })
})

describe('field frames', () => {
  it('a select names its control, describes it by its error and puts extra attributes on the control', async () => {
    const wrapper = await mountSuspended(defineComponent({
      setup: () => () => h(FormSelectField<string>, { 'id': 'role', 'label': 'Role', 'options': [{ id: 'writer', label: 'Writer' }], 'modelValue': 'writer', 'error': 'Choose a role', 'class': 'sm:w-60', 'data-testid': 'role-select' }),
    }))
    const select = wrapper.get('select')
    expect(wrapper.get('label').attributes('for')).toBe('role')
    expect(select.attributes('id')).toBe('role')
    expect(select.attributes('aria-invalid')).toBe('true')
    expect(select.attributes('aria-describedby')).toBe('role-error')
    expect(select.attributes('data-testid')).toBe('role-select')
    expect(wrapper.get('.form-field').classes()).toContain('sm:w-60')
    expect(select.classes()).not.toContain('sm:w-60')
  })

  it('a text field leaves "required" to the input itself', async () => {
    const wrapper = await mountSuspended(defineComponent({
      setup: () => () => h(FormTextField, { id: 'email', label: 'E-mail address', type: 'email', required: true, modelValue: '' }),
    }))
    expect(wrapper.get('input').attributes('required')).toBeDefined()
    expect(wrapper.get('label').text()).toBe('E-mail address')
  })
})
