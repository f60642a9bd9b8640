/**
 * The modules `brief` computes and renders with, imported when a briefing starts rather than when
 * the program starts. `runBrief` starts the browser first and imports these while it launches:
 * the browser's start-up (a separate process) then overlaps the loading of the statistics, the
 * region reader, the charts and the templates, instead of waiting behind them.
 */

/**
 * Import every module the briefing's computation and rendering need (once per process; Node
 * caches modules, so later calls cost nothing).
 *
 * @returns the functions `runBrief` calls, by their usual names.
 * @throws Error when a module cannot be loaded (a broken installation).
 * @example
 * const { loadWorkspace, runCalibration } = await briefModules();
 */
export async function briefModules() {
  const [workspace, calibrate, outlook, outlookJson, view, fonts, html, progress, kept, readKept, since] = await Promise.all([
    import("../workspace/loadWorkspace.js"),
    import("../calibrate/runCalibration.js"),
    import("./buildOutlookBeside.js"),
    import("../outlook/toOutlookJson.js"),
    import("../briefing/buildBriefingView.js"),
    import("../briefing/embeddedFonts.js"),
    import("../briefing/renderBriefingHtml.js"),
    import("./calibrate.js"),
    import("./keptOutlooks.js"),
    import("../review/readKeptOutlook.js"),
    import("../review/sinceLastBriefing.js"),
  ]);
  return {
    loadWorkspace: workspace.loadWorkspace,
    calibrationBasis: calibrate.calibrationBasis,
    runCalibration: calibrate.runCalibration,
    startHindcastBeside: outlook.startHindcastBeside,
    buildOutlookBeside: outlook.buildOutlookBeside,
    toOutlookJson: outlookJson.toOutlookJson,
    buildBriefingView: view.buildBriefingView,
    embeddedFontCss: fonts.embeddedFontCss,
    renderBriefingHtml: html.renderBriefingHtml,
    rehearsalHtml: html.rehearsalHtml,
    progressReporter: progress.progressReporter,
    readKeptOutlooks: kept.readKeptOutlooks,
    reviewRegion: kept.reviewRegion,
    readKeptOutlook: readKept.readKeptOutlook,
    sinceLastBriefing: since.sinceLastBriefing,
  };
}

/** What {@link briefModules} gives. */
export type BriefModules = Awaited<ReturnType<typeof briefModules>>;
