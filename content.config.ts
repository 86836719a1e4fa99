import { defineCollection, defineContentConfig, z } from '@nuxt/content'

export default defineContentConfig({
  collections: {
    // Site pages at the top of content/: /how-we-test, /cautions, /about.
    pages: defineCollection({
      type: 'page',
      source: '*.md',
      schema: z.object({
        title: z.string(),
        description: z.string(),
      }),
    }),
    // Pages for the desk only (served by app/pages/style-guide.vue behind the role check).
    staff: defineCollection({
      type: 'page',
      source: 'staff/*.md',
      schema: z.object({
        title: z.string(),
        description: z.string(),
        audience: z.literal('staff'),
      }),
    }),
  },
})
