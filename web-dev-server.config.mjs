// Serves the repository for the demo console (`npm start`, `npm run screenshot`): bare imports
// resolve to the built packages, Lit in its production build; "/" opens the console.
export default {
  rootDir: '.', nodeResolve: { exportConditions: ['production'] }, open: false, watch: false,
  port: Number(process.env.PORT || 8000), hostname: '127.0.0.1', appIndex: 'demo/index.html',
  middleware: [
    function openConsoleAtRoot(context, next) {
      if (context.url === '/' || context.url === '/demo' || context.url === '/demo/') {
        context.redirect('/demo/index.html');
        return undefined;
      }
      return next();
    },
  ],
};
