// Placeholder entry point until the command line lands.
System.Console.WriteLine("inspection-update: command line under construction.");
return 0;
