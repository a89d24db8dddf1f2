import { registerSW } from 'virtual:pwa-register'

/** The service worker that makes Ohmward installable and readable offline (production builds only). */
export function installServiceWorker(): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return
  registerSW({ immediate: true })
}
