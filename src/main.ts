import { createApp } from 'vue'
import { createPinia } from 'pinia'
import './styles/fonts.css'
// Vant function APIs are not auto-imported with their styles: load them once here.
import 'vant/es/toast/style'
import 'vant/es/dialog/style'
import 'vant/es/notify/style'
import './styles/index.css'
import './styles/theme.css'
import App from './App.vue'
import { createAppRouter } from './router'

const app = createApp(App)
app.use(createPinia())
app.use(createAppRouter())
app.mount('#app')
