/** Every key of the workbench and of the spectrum plot, read from the shared key lists. */
import { KEY_MAP } from '../keys/keyMap';
import { PLOT_KEYS } from '../plots/viewActions';
import { Overlay } from './Overlay';

const SHOW: Record<string, string> = { ArrowDown: '↓', ArrowUp: '↑', ArrowLeft: '←', ArrowRight: '→', Escape: 'Esc', Enter: 'Enter' };
const show = (k: string) => k.split('+').map((p) => SHOW[p] ?? p).join('+');

export function HelpOverlay({ onClose }: { onClose: () => void }) {
  return (
    <Overlay title="Keys" onClose={onClose} testId="help-overlay">
      <table className="keys" aria-label="Workbench keys">
        <tbody>
          {KEY_MAP.map((b) => (
            <tr key={b.action}>
              <td>
                {b.action === 'candidate' ? <kbd>1</kbd> : b.keys.map((k) => <kbd key={k}>{show(k)}</kbd>)}
                {b.action === 'candidate' && (
                  <>
                    {' – '}
                    <kbd>9</kbd>
                  </>
                )}
              </td>
              <td>{b.label}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <h3>Spectrum plot (after v, or a click on the plot)</h3>
      <table className="keys" aria-label="Plot keys">
        <tbody>
          {PLOT_KEYS.map((p) => (
            <tr key={p.action}>
              <td>
                {p.keys.map((k) => (
                  <kbd key={k}>{show(k)}</kbd>
                ))}
              </td>
              <td>{p.action}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </Overlay>
  );
}
