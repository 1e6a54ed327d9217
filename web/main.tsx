import { render } from 'preact';

function App() {
  return <h1>Sure Enough</h1>;
}
render(<App />, document.getElementById('app')!);
