/**
 * The widget bundle's version. It names the immutable URL the bundle is served under
 * (/widgets/<version>/…); the major part names the moving alias (/widgets/<major>/…). Raise it with every
 * change that ships: patch for fixes, minor for additions, major for anything a host page must adapt to.
 */
export const WIDGETS_VERSION = '1.0.0';
export const WIDGETS_MAJOR = WIDGETS_VERSION.split('.')[0]!;
