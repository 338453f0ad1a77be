import { createApp } from 'vue'
import { createPinia } from 'pinia'
// shipped with the app: no font is fetched from the network at run time
import '@fontsource/open-sans/400.css'
import '@fontsource/open-sans/600.css'
import '@fontsource/open-sans/700.css'
import './styles/theme.css'
import './styles/base.css'
import App from './App.vue'
import { createAppRouter } from './router'

const router = createAppRouter()
const app = createApp(App).use(createPinia()).use(router)
// mount once the first page is resolved (the session is resumed first), so no empty frame shows
void router.isReady().then(() => app.mount('#app'))
