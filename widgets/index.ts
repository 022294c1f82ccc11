/**
 * The Ohmstead widget bundle: one script defines every tag. Load it once (loading it again is harmless):
 *   <script type="module" src="https://<api>/widgets/1/ohmstead-widgets.js"></script>
 *   <ohmstead-compatibility key="ohs_emb_…"></ohmstead-compatibility>
 * Tags: ohmstead-compatibility, ohmstead-pack-value, ohmstead-wire-fuse, ohmstead-charge-time.
 */
import './compatibility/compatibility.ts';
import './pack-value/pack-value.ts';
import './wire-fuse/wire-fuse.ts';
import './charge-time/charge-time.ts';

export { WIDGETS_VERSION } from './version.ts';
export type { OhmsteadErrorDetail, OhmsteadReadyDetail, OhmsteadResultDetail } from './internal/events.ts';
