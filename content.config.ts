import { defineCollection, defineContentConfig, z } from '@nuxt/content'

// The shipped handbook: every page names its published sources in front matter.
export default defineContentConfig({
  collections: {
    handbook: defineCollection({
      type: 'page',
      source: 'handbook/**/*.md',
      schema: z.object({
        order: z.number().default(100),
        sources: z.array(z.string()).default([]),
      }),
    }),
  },
})
