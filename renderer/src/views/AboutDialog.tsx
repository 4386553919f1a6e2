/** About Forecatch, with the research-use caution. */
import { FORECATCH_VERSION } from '../../../shared/version';

export function AboutDialog({ onClose }: { onClose: () => void }) {
  return (
    <div className="modal-backdrop" role="presentation" onClick={onClose}>
      <div className="modal" role="dialog" aria-modal="true" aria-labelledby="about-title" onClick={(e) => e.stopPropagation()}>
        <h2 id="about-title">Forecatch {FORECATCH_VERSION}</h2>
        <p>
          An offline workbench for interception research: it reconstructs the object's motion with Kalman filters and RTS smoothers under dynamics hypotheses, detects EMG onsets for review, predicts the
          object's arrival from what was known before each onset, and compares the hypotheses across trials.
        </p>
        <p className="caution">
          <strong>Research use only.</strong> Forecatch analyses research recordings. It is not a medical device, and its output is not a clinical assessment of anyone.
        </p>
        <p className="muted small">The demo study is invented data from Forecatch's own simulator of a motorised rail lab. Colours follow the Okabe-Ito colour-blind-safe palette.</p>
        <button autoFocus onClick={onClose}>
          Close
        </button>
      </div>
    </div>
  );
}
