// Karma in Debian's headless Chromium (CHROME_BIN=/usr/bin/chromium), single run.
process.env.CHROME_BIN = process.env.CHROME_BIN || '/usr/bin/chromium';

module.exports = function (config) {
  config.set({
    basePath: '',
    frameworks: ['jasmine'],
    plugins: [require('karma-jasmine'), require('karma-chrome-launcher'), require('karma-coverage')],
    client: { jasmine: { random: true }, clearContext: false },
    reporters: ['progress'],
    browsers: ['ChromeHeadlessCI'],
    customLaunchers: {
      ChromeHeadlessCI: {
        base: 'ChromeHeadless',
        flags: [
          '--headless',
          '--no-sandbox',
          '--disable-gpu',
          '--disable-dev-shm-usage',
          '--disable-background-networking',
          '--disable-component-update',
          '--disable-sync',
          '--no-first-run',
        ],
      },
    },
    browserNoActivityTimeout: 120000,
    captureTimeout: 120000,
    singleRun: true,
    autoWatch: false,
    restartOnFileChange: false,
  });
};
