/** Defines `<ohmstead-pack-value>` (once, however often the bundle is loaded). */
import { defineElement } from '../internal/base-element.ts';
import { OhmsteadPackValueElement } from './pack-value.element.ts';

defineElement('ohmstead-pack-value', OhmsteadPackValueElement);
