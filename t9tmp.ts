console.log(process.execArgv, process.argv.slice(0,2));
