/** Chart.js with only the parts the app uses registered (tree-shaken; no 'chart.js/auto'). */
import { Chart, LineController, LineElement, PointElement, LinearScale, LogarithmicScale, Legend, Tooltip, Title } from 'chart.js';

Chart.register(LineController, LineElement, PointElement, LinearScale, LogarithmicScale, Legend, Tooltip, Title);

export { Chart };
