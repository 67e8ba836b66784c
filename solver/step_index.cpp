// placeholder; replaced by the analytic step-index module
