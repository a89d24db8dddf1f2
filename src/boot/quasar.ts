import type { App } from 'vue'
import { Quasar, Notify, Dialog, Loading } from 'quasar'
import '@quasar/extras/material-icons/material-icons.css'
import '@fontsource/nunito/400.css'
import '@fontsource/nunito/600.css'
import '@fontsource/nunito/700.css'
import 'quasar/src/css/index.sass'
import '../css/app.scss'

export function installQuasar(app: App): void {
  app.use(Quasar, {
    plugins: { Notify, Dialog, Loading },
    config: { notify: { position: 'top', timeout: 4000 } },
  })
}
