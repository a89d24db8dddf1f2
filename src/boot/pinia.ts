import type { App } from 'vue'
import { createPinia } from 'pinia'

export function installPinia(app: App): void {
  app.use(createPinia())
}
