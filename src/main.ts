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
import { savedToday } from './offline/saved-today'
import { useSessionStore } from './stores/session'
import { localDay } from './utils/dates'

const app = createApp(App)
app.use(createPinia())
const router = createAppRouter()
// A lifter kept on the phone opens on Train: unless the phone kept today's plan (which Train
// paints at once, refreshing it after that first paint), today's request goes out now,
// overlapping the app's start-up work, and the Train screen takes its answer.
const session = useSessionStore()
const lifter = session.isSignedIn && session.role === 'lifter' ? session.user : null
if (lifter && opensOnTrain(router, window.location.pathname) && !savedToday(lifter.id, localDay())) startEarlyToday()
app.use(router)
app.mount('#app')
