// Jest loads modules as CommonJS: geotiff's CommonJS build requires quick-lru, a package that is
// ES modules only. Node loads the terrain package's import('geotiff') natively; under Jest,
// ts-jest compiles quick-lru's JavaScript to CommonJS (every other node_modules file as is).
const ES_ONLY = ['quick-lru'];

module.exports = {
  esOnlyTransform: {
    [`/node_modules/(${ES_ONLY.join('|')})/.+\\.js$`]: [
      'ts-jest',
      { tsconfig: { allowJs: true, module: 'commonjs', target: 'es2022' }, diagnostics: false },
    ],
  },
  esOnlyIgnore: [`/node_modules/(?!(${ES_ONLY.join('|')})/)`],
};
