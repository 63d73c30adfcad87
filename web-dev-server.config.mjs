export default {
  rootDir: '.', nodeResolve: { exportConditions: ['production'] }, open: false, watch: false,
  port: Number(process.env.PORT || 8000), hostname: '127.0.0.1', appIndex: 'demo/index.html',
};
