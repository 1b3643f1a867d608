# Times base R's stats::arima(method = "ML") in a plain loop over the series listed in a file
# (one CSV path per line, columns week,qty), for the order given; prints the elapsed seconds of the
# loop on the first line, then one log-likelihood per series (NA where arima failed).
# Usage: Rscript test/bench/fit-arima.R LIST p d q OUT
args <- commandArgs(trailingOnly = TRUE)
files <- readLines(args[1])
ord <- as.integer(args[2:4])
ys <- lapply(files, function(f) read.csv(f)$qty)
ll <- rep(NA_real_, length(ys))
elapsed <- system.time(
  for (i in seq_along(ys)) {
    fit <- tryCatch(arima(ys[[i]], order = ord, method = "ML"), error = function(e) NULL)
    if (!is.null(fit)) ll[i] <- fit$loglik
  }
)[["elapsed"]]
writeLines(c(format(elapsed, digits = 10), format(ll, digits = 17)), args[5])
