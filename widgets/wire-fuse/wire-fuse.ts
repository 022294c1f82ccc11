/** Defines `<ohmstead-wire-fuse>` (once, however often the bundle is loaded). */
import { defineElement } from '../internal/base-element.ts';
import { OhmsteadWireFuseElement } from './wire-fuse.element.ts';

defineElement('ohmstead-wire-fuse', OhmsteadWireFuseElement);
