import { defineStore } from 'pinia'

// Interface state only; server data lives in the useFetch cache, never here.
export const useUiStore = defineStore('ui', {
  state: () => ({ menuOpen: false }),
  actions: {
    toggleMenu() {
      this.menuOpen = !this.menuOpen
    },
    closeMenu() {
      this.menuOpen = false
    },
  },
})
