/** Stylesheets are imported for their side effect; Vite bundles them into one CSS file. */
declare module '*.css';
