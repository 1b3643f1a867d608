# ARMA grid reference: base R stats::arima(method = "ML") over p, q = 0..3 with a mean on
# every d = 0 series, plus a few d = 1 fits, on open R datasets and seeded simulations.
# Usage: Rscript r-arma-grid.R OUT.json      (see test/reference/README.md)
args <- commandArgs(trailingOnly = TRUE)
out_path <- if (length(args) >= 1) args[1] else "r-arma-grid.json"
script_dir <- dirname(sub("^--file=", "", grep("^--file=", commandArgs(FALSE), value = TRUE)[1]))
source(file.path(script_dir, "common.R"))
RNGkind("Mersenne-Twister", "Inversion", "Rejection")

source(file.path(script_dir, "series-catalogue.R"))
series <- build_series()
sims_names <- names(series)[grepl("^sim-", names(series)) & names(series) != "sim-arima111-156"]

fits <- list()
d0_series <- c(
  "LakeHuron", "lh", "Nile", "presidents", "sunspot.year",
  sims_names
)
for (nm in d0_series) {
  y <- series[[nm]]$data
  for (p in 0:3) for (q in 0:3) {
    fits[[length(fits) + 1]] <- list(
      id = sprintf("%s/(%d,0,%d)+mean", nm, p, q),
      series = nm, order = list(p = p, d = 0, q = q), includeMean = TRUE,
      r = fit_r_arima(as.numeric(y), p, 0, q, TRUE, polish = TRUE)
    )
  }
}
d1_fits <- list(
  list("WWWusage", 1, 0), list("WWWusage", 3, 0), list("WWWusage", 1, 1), list("WWWusage", 0, 2),
  list("WWWusage", 2, 2), list("Nile", 0, 1), list("LakeHuron", 1, 0), list("sim-arima111-156", 0, 1),
  list("sim-arima111-156", 1, 1), list("sim-arima111-156", 2, 1), list("sim-arima111-156", 1, 2)
)
for (f in d1_fits) {
  nm <- f[[1]]
  p <- f[[2]]
  q <- f[[3]]
  y <- as.numeric(series[[nm]]$data)
  r <- fit_r_arima(y, p, 1, q, FALSE, polish = TRUE)
  # R treats the first value through a diffuse prior (kappa = 1e6); for reference also the fit
  # of the ARMA(p,q) without mean to the first difference, which is what "fit the d-th
  # difference" means exactly.
  r$diffSeriesFit <- fit_r_arima(diff(y), p, 0, q, FALSE)[c("ok", "loglik", "ar", "ma", "sigma2")]
  fits[[length(fits) + 1]] <- list(
    id = sprintf("%s/(%d,1,%d)", nm, p, q),
    series = nm, order = list(p = p, d = 1, q = q), includeMean = FALSE, r = r
  )
}

write_json_file(list(
  rVersion = R.version.string,
  rngKind = I(RNGkind()),
  series = unname(series),
  fits = fits
), out_path)
cat("wrote", out_path, "with", length(fits), "fits\n")
