/**
 * The one place that registers chart.js parts (only those our charts use, so the bundle
 * stays small) and sets the notebook's chart defaults. Chart components import `Chart` from here.
 */
import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, LineElement, PointElement, ScatterController, Tooltip } from 'chart.js';
import { intervals } from './intervals';
import { referenceLines } from './referenceLines';
import { GRID_COLOUR, TEXT_COLOUR } from './palette';

Chart.register(BarController, BarElement, ScatterController, LineElement, PointElement, LinearScale, CategoryScale, Tooltip, Legend, referenceLines, intervals);

Chart.defaults.font.family = "system-ui, -apple-system, 'Segoe UI', Roboto, 'Noto Sans', 'DejaVu Sans', sans-serif";
Chart.defaults.font.size = 12;
Chart.defaults.color = TEXT_COLOUR;
Chart.defaults.borderColor = GRID_COLOUR;
Chart.defaults.animation = false;
Chart.defaults.maintainAspectRatio = false;
Chart.defaults.responsive = true;

export { Chart };
