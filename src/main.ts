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
import { startEarlyToday } from './api/train'
import { createAppRouter, opensOnTrain } from './router'
import { useSessionStore } from './stores/session'

const app = createApp(App)
app.use(createPinia())
const router = createAppRouter()
// A lifter kept on the phone opens on Train: today's request goes out now, overlapping the
// app's start-up work, and the Train screen takes its answer.
const session = useSessionStore()
if (session.isSignedIn && session.role === 'lifter' && opensOnTrain(router, window.location.pathname)) startEarlyToday()
app.use(router)
app.mount('#app')
