/** Entry of the planner's screens: connect to the service and mount the app. */
import { createRoot } from 'react-dom/client';
import { App } from './App';
import { connectApi } from './api-client';
import './styles.css';

const root = document.getElementById('root');
if (root) createRoot(root).render(<App api={connectApi()} />);
