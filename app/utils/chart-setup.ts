import { CategoryScale, Chart as ChartJS, Decimation, Filler, Legend, LinearScale, LineController, LineElement, PointElement, Tooltip } from 'chart.js'
import annotationPlugin from 'chartjs-plugin-annotation'

/**
 * Everything Tidewright's charts use, registered once and before any chart exists. The
 * annotation plugin keeps a state per chart from the chart's creation: a chart made before it
 * was registered (the lighting ramp, say, drawn before the tank charts load) would break on its
 * next update, so no chart component registers its own pieces.
 */
ChartJS.register(LineController, LineElement, PointElement, LinearScale, CategoryScale, Tooltip, Legend, Filler, Decimation, annotationPlugin)
