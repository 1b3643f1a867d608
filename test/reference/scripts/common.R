# Shared helpers for the reference-fixture scripts (base R only: no add-on packages,
# so a stock Debian r-base-core is enough). Sourced by the other *.R scripts.

# Minimal JSON writer. Scalars (length-1 vectors) are written as JSON scalars; wrap a
# vector in I() to force a JSON array even at length 0 or 1. NA / NaN / Inf -> null.
# Numbers are written with 15 significant digits (enough for every tolerance we test).
json_str <- function(s) {
  s <- gsub("\\\\", "\\\\\\\\", s)
  s <- gsub("\"", "\\\\\"", s)
  s <- gsub("\n", "\\\\n", s)
  s <- gsub("\t", "\\\\t", s)
  paste0("\"", s, "\"")
}
json_num <- function(x) {
  x <- as.numeric(x)
  out <- sprintf("%.15g", x)
  out[!is.finite(x)] <- "null"
  out
}
to_json <- function(x) {
  if (is.null(x)) return("null")
  if (is.list(x)) {
    if (length(x) == 0) return(if (is.null(names(x))) "[]" else "{}")
    vals <- vapply(x, to_json, "")
    if (!is.null(names(x))) {
      return(paste0("{", paste0(json_str(names(x)), ":", vals, collapse = ","), "}"))
    }
    return(paste0("[", paste(vals, collapse = ","), "]"))
  }
  as_array <- inherits(x, "AsIs") || length(x) != 1
  x <- unclass(x)
  names(x) <- NULL
  vals <- if (is.character(x)) {
    ifelse(is.na(x), "null", json_str(x))
  } else if (is.logical(x)) {
    ifelse(is.na(x), "null", ifelse(x, "true", "false"))
  } else {
    json_num(x)
  }
  if (as_array) paste0("[", paste(vals, collapse = ","), "]") else vals
}

# Root moduli of 1 - phi_1 z - ... - phi_p z^p (AR) and of 1 + ma_1 z + ... (R's MA sign).
# Stationary / invertible <=> every modulus > 1.
ar_root_moduli <- function(ar) if (length(ar) == 0) numeric(0) else sort(Mod(polyroot(c(1, -ar))))
ma_root_moduli_r <- function(ma_r) if (length(ma_r) == 0) numeric(0) else sort(Mod(polyroot(c(1, ma_r))))

# Run one stats::arima call with its warnings collected instead of printed.
arima_quiet <- function(...) {
  warns <- character(0)
  fit <- withCallingHandlers(
    tryCatch(stats::arima(...), error = function(e) e),
    warning = function(w) {
      warns <<- c(warns, conditionMessage(w))
      invokeRestart("muffleWarning")
    }
  )
  list(fit = fit, warnings = warns)
}

# Turn an arima fit into a list ready for to_json. MA coefficients are converted to the
# project's Box-Jenkins "ma-minus" convention: theta_ours = -ma_R.
summarise_arima <- function(fit, warns, p, q, horizon) {
  if (inherits(fit, "error")) {
    return(list(ok = FALSE, error = conditionMessage(fit), warnings = I(warns)))
  }
  cf <- fit$coef
  ar <- if (p > 0) unname(cf[paste0("ar", seq_len(p))]) else numeric(0)
  ma_r <- if (q > 0) unname(cf[paste0("ma", seq_len(q))]) else numeric(0)
  has_mean <- "intercept" %in% names(cf)
  se_all <- suppressWarnings(sqrt(diag(fit$var.coef)))
  se_of <- function(nm) if (nm %in% names(se_all)) unname(se_all[nm]) else NA
  se_ar <- if (p > 0) vapply(paste0("ar", seq_len(p)), se_of, 0) else numeric(0)
  se_ma <- if (q > 0) vapply(paste0("ma", seq_len(q)), se_of, 0) else numeric(0)
  pr <- tryCatch(predict(fit, n.ahead = horizon), error = function(e) NULL)
  k <- length(cf) + 1 # every estimated coefficient plus sigma2
  list(
    ok = TRUE,
    error = NULL,
    warnings = I(warns),
    optimCode = fit$code,
    loglik = fit$loglik,
    ar = I(ar),
    ma = I(-ma_r),
    mean = if (has_mean) unname(cf["intercept"]) else NULL,
    sigma2 = fit$sigma2,
    stderr = list(ar = I(unname(se_ar)), ma = I(unname(se_ma)), mean = if (has_mean) se_of("intercept") else NULL),
    aic = fit$aic,
    bic = -2 * fit$loglik + log(fit$nobs) * k,
    nobs = fit$nobs,
    nParams = k,
    arRootModuli = I(ar_root_moduli(ar)),
    maRootModuli = I(ma_root_moduli_r(ma_r)),
    forecast = if (is.null(pr)) NULL else list(mean = I(as.numeric(pr$pred)), se = I(as.numeric(pr$se)))
  )
}

# One stats::arima(method = "ML") fit with default settings, warnings and errors captured.
# With polish = TRUE, also R's optimiser restarted at its own estimate on the untransformed
# parameters with reltol 1e-14 ("polished"): R's default stops at reltol 1e-8, which leaves
# parameters loose by up to ~1e-2 on flat likelihoods, too loose to compare at 1e-3.
fit_r_arima <- function(y, p, d, q, include_mean, horizon = 12, polish = FALSE) {
  a <- arima_quiet(y, order = c(p, d, q), include.mean = include_mean, method = "ML")
  out <- summarise_arima(a$fit, a$warnings, p, q, horizon)
  if (polish && out$ok) {
    b <- arima_quiet(
      y,
      order = c(p, d, q), include.mean = include_mean, method = "ML", init = a$fit$coef,
      transform.pars = FALSE, optim.control = list(reltol = 1e-14, maxit = 5000)
    )
    out$polished <- summarise_arima(b$fit, b$warnings, p, q, horizon)
  }
  out
}

# Simulate a stationary ARMA in the project's convention (ma-minus) with R's arima.sim
# (which uses the plus sign, hence -theta), a burn-in of 200, then add the mean and
# round to 3 decimals so the fixture stores the exact data the references were given.
sim_arma <- function(n, ar = numeric(0), theta = numeric(0), mean = 0, sd = 1) {
  x <- stats::arima.sim(model = list(ar = ar, ma = -theta), n = n, sd = sd, n.start = 200)
  round(as.numeric(x) + mean, 3)
}

# Knock out runs of 1-3 consecutive weeks (stocked-out weeks seen as missing): `runs` runs
# placed at random, never in the first 4 or last 4 weeks.
add_stockout_gaps <- function(y, runs) {
  n <- length(y)
  for (r in seq_len(runs)) {
    len <- sample(1:3, 1)
    start <- sample(5:(n - 4 - len), 1)
    y[start:(start + len - 1)] <- NA
  }
  y
}

write_json_file <- function(obj, path) {
  con <- file(path, "w")
  writeLines(to_json(obj), con)
  close(con)
}
