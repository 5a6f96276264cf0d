/* Production build of the add-in: dist/functions.js (+ generated functions.json), dist/taskpane.html + script, assets.
 * The custom-function files are found by their JSDoc tag, so a new src/functions/<area>.ts needs no edit here. */
const fs = require("fs");
const path = require("path");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const { sources, Compilation } = require("webpack");
const { helpPage, tableLabels } = require("./scripts/help-page.cjs");

/** Where npm start serves the function reference page generated below. */
const HELP_PAGE = "https://localhost:3000/help.html";

const functionsDir = path.resolve(__dirname, "src/functions");
const functionFiles = fs
  .readdirSync(functionsDir)
  .filter((f) => f.endsWith(".ts"))
  .map((f) => path.join(functionsDir, f))
  .filter((f) => fs.readFileSync(f, "utf8").includes("@customfunction"))
  .sort();

/** Adds the flags the metadata generator cannot write (error cells must reach the functions so they can name them). */
class MetadataFlagsPlugin {
  apply(compiler) {
    compiler.hooks.thisCompilation.tap("MetadataFlagsPlugin", (compilation) => {
      compilation.hooks.processAssets.tap(
        { name: "MetadataFlagsPlugin", stage: Compilation.PROCESS_ASSETS_STAGE_ADDITIONS },
        () => {
          const asset = compilation.getAsset("functions.json");
          if (!asset) return;
          const meta = JSON.parse(asset.source.source().toString());
          // Every function's help link points at its own section of the generated reference page (help.html).
          for (const f of meta.functions) f.helpUrl = `${HELP_PAGE}#ASKEW.${f.name}`;
          const out = { allowErrorForDataTypeAny: true, ...meta };
          compilation.updateAsset("functions.json", new sources.RawSource(JSON.stringify(out, null, 2)));
        },
      );
    });
    // The function reference page every helpUrl points at (dist/help.html), from the final metadata and the tables'
    // labels; written after emit so no minifier rewrites it and it is served exactly as generated.
    compiler.hooks.afterEmit.tap("MetadataFlagsPlugin", (compilation) => {
      const file = path.join(compilation.outputOptions.path, "functions.json");
      if (!fs.existsSync(file)) return;
      const meta = JSON.parse(fs.readFileSync(file, "utf8"));
      fs.writeFileSync(path.join(compilation.outputOptions.path, "help.html"), helpPage(meta, tableLabels(__dirname)));
    });
  }
}

/** The host page's template with office.js from this origin and the policy's script-src reduced to 'self'. */
const HOSTED_OFFICE_JS = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";
function standalonePage() {
  const html = fs.readFileSync(path.resolve(__dirname, "src/taskpane/taskpane.html"), "utf8");
  if (!html.includes(`<script src="${HOSTED_OFFICE_JS}"></script>`)) throw new Error("taskpane.html: the hosted office.js script tag moved; update standalonePage()");
  return html
    .replace(`<script src="${HOSTED_OFFICE_JS}"></script>`, `<script src="office-js/office.js"></script>`)
    .replace("script-src 'self' https://appsforoffice.microsoft.com;", "script-src 'self';")
    .replace("<!-- Strict policy: our own scripts plus the host platform's office.js (the host requires it from its CDN). -->", "<!-- Standalone page: everything from this origin, office.js included (npm package @microsoft/office-js). -->");
}

module.exports = (env, argv) => ({
  mode: argv.mode || "production",
  devtool: "source-map",
  entry: {
    functions: ["./src/functions/standalone.ts", ...functionFiles],
    taskpane: "./src/taskpane/taskpane.ts",
  },
  output: { path: path.resolve(__dirname, "dist"), filename: "[name].js", clean: true },
  resolve: { extensions: [".ts", ".js"] },
  module: {
    rules: [
      { test: /\.ts$/, exclude: /node_modules/, use: { loader: "ts-loader", options: { transpileOnly: true } } },
    ],
  },
  performance: { hints: false },
  plugins: [
    new CustomFunctionsMetadataPlugin({ output: "functions.json", input: functionFiles }),
    new MetadataFlagsPlugin(),
    new HtmlWebpackPlugin({
      filename: "taskpane.html",
      template: "./src/taskpane/taskpane.html",
      chunks: ["functions", "taskpane"],
      chunksSortMode: "manual",
      inject: "body",
      scriptLoading: "blocking",
    }),
    // The standalone page (a browser without the spreadsheet): the same page, but office.js from the npm package
    // @microsoft/office-js, served from this origin, so the page makes no outside request. The host page keeps the
    // platform's hosted office.js, which the platform requires for add-ins it loads.
    new HtmlWebpackPlugin({
      filename: "standalone.html",
      templateContent: standalonePage(),
      chunks: ["functions", "taskpane"],
      chunksSortMode: "manual",
      inject: "body",
      scriptLoading: "blocking",
    }),
    new CopyWebpackPlugin({ patterns: [{ from: "assets/*.png", to: "assets/[name][ext]" }, { from: "manifest.xml", to: "manifest.xml" },
        { from: "src/taskpane/taskpane.css", to: "taskpane.css" },
        // The files office.js loads outside a host: itself, its host-to-file table and its English strings (test/pane/standalone.test.ts
        // checks that the standalone page requests nothing else).
        { from: "node_modules/@microsoft/office-js/dist/office.js", to: "office-js/office.js", info: { minimized: true } },
        { from: "node_modules/@microsoft/office-js/dist/o15apptofilemappingtable.js", to: "office-js/o15apptofilemappingtable.js", info: { minimized: true } },
        { from: "node_modules/@microsoft/office-js/dist/en-us/office_strings.js", to: "office-js/en-us/office_strings.js", info: { minimized: true } },
        { from: "node_modules/@microsoft/office-js/LICENSE.md", to: "office-js/LICENSE.md" }] }),
  ],
});
