import { createApp } from 'vue'
import App from './App.vue'
import { installQuasar } from './boot/quasar'
import { installPinia } from './boot/pinia'
import { createAppRouter } from './router/index'
import { installServiceWorker } from './boot/pwa'

const app = createApp(App)
installQuasar(app)
installPinia(app)
app.use(createAppRouter())
app.mount('#app')
installServiceWorker()
