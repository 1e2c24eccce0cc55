/** Plain-words limitations of each estimator, stated with every fit. */
import type { EstimatorKind } from "./types";

/** The catalogue of limitations per estimator. */
export const LIMITATIONS: Readonly<Record<EstimatorKind, readonly string[]>> = {
  ma: [
    "Every return in the window counts the same, however old, and returns outside it count for nothing.",
    "A large return makes the estimate jump when it enters the window and drop just as suddenly when it leaves, M days later, although nothing happened that day.",
    "The window length is chosen, not estimated; a short window is noisy and a long one is slow to react.",
    "The forecast is flat: the same variance for every future day, with no reversion to a long-run level.",
  ],
  arch: [
    "Only the last m squared returns move the variance, each with a fixed weight; older returns count for nothing.",
    "Fitting many lags needs a long history and the weights of distant lags are poorly determined.",
    "Normal errors are assumed in the fit, which understates the chance of extreme days.",
  ],
  ewma: [
    "The decay factor λ is chosen, not estimated, unless it was fitted; 0.94 is a convention for daily data.",
    "There is no long-run variance: the forecast is flat, the same variance for every future day, with no mean reversion.",
    "The estimate depends on the start-up variance until its weight has decayed (about ln 0.01 / ln λ days for 1 %).",
    "Normal returns are assumed when the variance is turned into VaR, which understates the chance of extreme days.",
  ],
  garch: [
    "Maximum likelihood needs several hundred to a thousand daily returns to give stable parameters; fewer give noisy estimates.",
    "When α+β is close to 1 the fit is near-integrated: the long-run variance and the speed of reversion are poorly determined and shocks barely die out.",
    "The likelihood is flat along the ω–β ridge, so ω and β are individually less certain than the forecasts they produce.",
    "The result depends on the start-up variance rule, which is stated with the fit.",
    "Normal errors understate the chance of extreme days; Student-t errors help but do not capture every tail event.",
    "One regime is assumed for the whole history: a change in market behaviour is averaged over, not detected.",
  ],
};

/** The limitation of a normal error assumption, added to fits that make it. */
export const NORMAL_TAILS = "Normal errors are assumed: extreme returns are more frequent in practice than a normal distribution says.";
