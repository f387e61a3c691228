#!/usr/bin/env node
import '../dist/trivar.js';
