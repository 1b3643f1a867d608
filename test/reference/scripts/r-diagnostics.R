# Diagnostics reference, step 1 (base R): for a few series, an arima(method = "ML") fit, its
# residuals (one-step innovations), Box.test(type = "Ljung-Box", fitdf = p + q) at lags 10 and
# 20, the KPSS level statistic computed from its definition, and Jarque-Bera from its definition.
# Step 2 (sm-diagnostics.py) adds statsmodels' kpss, acorr_ljungbox and jarque_bera.
# Usage: Rscript r-diagnostics.R OUT.json      (see test/reference/README.md)
args <- commandArgs(trailingOnly = TRUE)
out_path <- if (length(args) >= 1) args[1] else "r-diagnostics.json"
script_dir <- dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)[1]))
source(file.path(script_dir, "common.R"))
source(file.path(script_dir, "series-catalogue.R"))
catalogue <- build_series()

# KPSS level-stationarity statistic (Kwiatkowski, Phillips, Schmidt & Shin 1992):
# e = y - mean(y), S_t = cumsum(e), eta = sum(S^2) / (n^2 s2(l)),
# s2(l) = sum(e^2)/n + (2/n) sum_{s=1..l} (1 - s/(l+1)) sum_{t=s+1..n} e_t e_{t-s}.
kpss_level <- function(y, l) {
  n <- length(y)
  e <- y - mean(y)
  s2 <- sum(e^2) / n
  if (l > 0) for (s in 1:l) s2 <- s2 + (2 / n) * (1 - s / (l + 1)) * sum(e[(s + 1):n] * e[1:(n - s)])
  list(statistic = sum(cumsum(e)^2) / (n^2 * s2), lags = l)
}

# Jarque & Bera (1980): JB = n/6 (S^2 + (K - 3)^2 / 4), moments about the mean divided by n.
jarque_bera <- function(x) {
  n <- length(x)
  m <- mean(x)
  m2 <- mean((x - m)^2)
  S <- mean((x - m)^3) / m2^1.5
  K <- mean((x - m)^4) / m2^2
  jb <- n / 6 * (S^2 + (K - 3)^2 / 4)
  list(statistic = jb, skewness = S, kurtosis = K, pValue = pchisq(jb, 2, lower.tail = FALSE))
}

cases <- list(
  list(series = "LakeHuron", p = 2, d = 0, q = 0),
  list(series = "Nile", p = 1, d = 0, q = 1),
  list(series = "sim-ar1-156", p = 1, d = 0, q = 0),
  list(series = "sim-arma22-156", p = 2, d = 0, q = 2),
  list(series = "sim-ar1-nearunit-156", p = 1, d = 0, q = 0),
  list(series = "sim-ma1-104", p = 0, d = 0, q = 1),
  list(series = "WWWusage", p = 1, d = 1, q = 1)
)
out <- list()
for (cs in cases) {
  y <- as.numeric(catalogue[[cs$series]]$data)
  n <- length(y)
  fit <- stats::arima(y, order = c(cs$p, cs$d, cs$q), include.mean = cs$d == 0, method = "ML")
  res <- as.numeric(residuals(fit))
  # With d = 1 R's first residual belongs to the diffuse first value; the ARMA innovations of
  # diff(y) are the rest, so drop it for the residual tests.
  if (cs$d > 0) res <- res[-seq_len(cs$d)]
  fitdf <- cs$p + cs$q
  lb <- lapply(c(10, 20), function(h) {
    b <- Box.test(res, lag = h, type = "Ljung-Box", fitdf = fitdf)
    list(lags = h, fitdf = fitdf, df = unname(b$parameter), statistic = unname(b$statistic), pValue = b$p.value)
  })
  l4 <- floor(4 * (n / 100)^0.25)
  l12 <- floor(12 * (n / 100)^0.25)
  dy <- diff(y)
  out[[length(out) + 1]] <- list(
    series = cs$series,
    order = list(p = cs$p, d = cs$d, q = cs$q),
    data = I(y),
    fit = list(
      ar = I(unname(fit$coef[grepl("^ar", names(fit$coef))])),
      ma = I(-unname(fit$coef[grepl("^ma", names(fit$coef))])),
      mean = if (cs$d == 0) unname(fit$coef["intercept"]) else NULL,
      sigma2 = fit$sigma2, loglik = fit$loglik
    ),
    residuals = I(res),
    r = list(
      ljungBox = lb,
      kpss = list(
        series = list(l4 = kpss_level(y, l4), l12 = kpss_level(y, l12)),
        diff1 = list(l4 = kpss_level(dy, floor(4 * (length(dy) / 100)^0.25)), l12 = kpss_level(dy, floor(12 * (length(dy) / 100)^0.25)))
      ),
      jarqueBera = jarque_bera(res)
    )
  )
}
write_json_file(list(rVersion = R.version.string, cases = out), out_path)
cat("wrote", out_path, "with", length(out), "cases\n")
