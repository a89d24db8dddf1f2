import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { ReviewSummary } from '@shared/schemas/reviews'
import { reviewsApi } from '../api/reviews'

/** The reviews inbox: my reviews as client and as advisor, with unread counts. */
export const useReviewsStore = defineStore('reviews', () => {
  const items = ref<ReviewSummary[]>([])
  const status = ref<'idle' | 'loading' | 'success' | 'error'>('idle')
  const error = ref<Error | null>(null)

  const unreadTotal = computed(() => items.value.reduce((n, r) => n + r.unread, 0))
  const asAdvisor = computed(() => items.value.filter((r) => r.mySide === 'advisor'))
  const asClient = computed(() => items.value.filter((r) => r.mySide === 'client'))

  async function load(): Promise<void> {
    status.value = 'loading'
    error.value = null
    try {
      items.value = (await reviewsApi.list()).items
      status.value = 'success'
    } catch (e) {
      error.value = e as Error
      status.value = 'error'
    }
  }

  /** Opening a review marks it read; reflect it without a reload. */
  function markRead(id: string): void {
    const r = items.value.find((x) => x.id === id)
    if (r) r.unread = 0
  }

  return { items, status, error, unreadTotal, asAdvisor, asClient, load, markRead }
})
