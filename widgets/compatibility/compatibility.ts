/** Defines `<ohmstead-compatibility>` (once, however often the bundle is loaded). */
import { defineElement } from '../internal/base-element.ts';
import { OhmsteadCompatibilityElement } from './compatibility.element.ts';

defineElement('ohmstead-compatibility', OhmsteadCompatibilityElement);
