/** Defines `<ohmstead-charge-time>` (once, however often the bundle is loaded). */
import { defineElement } from '../internal/base-element.ts';
import { OhmsteadChargeTimeElement } from './charge-time.element.ts';

defineElement('ohmstead-charge-time', OhmsteadChargeTimeElement);
