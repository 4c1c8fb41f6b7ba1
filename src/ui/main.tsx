import { render } from 'preact';
import { App } from './App.tsx';
import './app.css';

const root = document.getElementById('app');
if (!root) throw new Error('Lampwalk: the page has no #app element');
render(<App />, root);
