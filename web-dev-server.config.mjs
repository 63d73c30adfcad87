export default {
  rootDir: '.', nodeResolve: true, open: false, watch: false,
  port: Number(process.env.PORT || 8000), hostname: '127.0.0.1', appIndex: 'demo/index.html',
};
