export default defineAppConfig({
  // The demo magazine is invented for Pullsheet; every page that names it says so.
  magazine: {
    name: 'Sump & Sprocket',
    note: 'a fictional magazine made up for this demo',
  },
})
